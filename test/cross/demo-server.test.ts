// The demo server as a user starts it: `node demo/start.mjs --no-build` (what `npm start` runs after its
// build) on a free port. Checks the running process, not the options passed to it: the listening
// socket as the kernel reports it (/proc/net/tcp, /proc/net/tcp6), and the answers to hostile
// requests sent as raw bytes, so no client library normalises a path or fills in a Host header.
// The exposure rules are the project's own (common practice for a local demo server, no source).

import { type ChildProcess, spawn } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { connect } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

let child: ChildProcess;
let port = 0;

beforeAll(async () => {
  if (!existsSync('demo/dist/console.js'))
    throw new Error('demo/dist/console.js is missing: run "npm run build" first');
  child = spawn(process.execPath, ['demo/start.mjs', '--no-build'], {
    env: { ...process.env, PORT: '0' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  port = await new Promise<number>((resolve, reject) => {
    let out = '';
    const timer = setTimeout(() => reject(new Error(`demo server did not start: ${out}`)), 20000);
    child.stdout!.on('data', (chunk: Buffer) => {
      out += chunk.toString();
      const m = /http:\/\/127\.0\.0\.1:(\d+)\/demo\/index\.html/.exec(out);
      if (m) {
        clearTimeout(timer);
        resolve(Number(m[1]));
      }
    });
    child.stderr!.on('data', (chunk: Buffer) => {
      out += chunk.toString();
    });
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`demo server exited with ${code}: ${out}`));
    });
  });
});

afterAll(() => {
  child?.kill('SIGTERM');
});

/** Sends `request` verbatim to 127.0.0.1:port and returns the status code and the whole response. */
function raw(request: string): Promise<{ status: number; text: string }> {
  return new Promise((resolve, reject) => {
    const socket = connect({ host: '127.0.0.1', port }, () => socket.end(request));
    let text = '';
    socket.setTimeout(5000, () => {
      socket.destroy();
      reject(new Error(`no answer to ${JSON.stringify(request)}`));
    });
    socket.on('data', (chunk) => {
      text += chunk.toString('latin1');
    });
    socket.on('end', () => resolve({ status: Number(/^HTTP\/1\.[01] (\d{3})/.exec(text)?.[1] ?? 0), text }));
    socket.on('error', reject);
  });
}

const get = (path: string, host = `127.0.0.1:${port}`) =>
  raw(`GET ${path} HTTP/1.1\r\nHost: ${host}\r\nConnection: close\r\n\r\n`);

/** Local addresses of the TCP sockets in state LISTEN on `port`, decoded from /proc/net/tcp and tcp6. */
function listeningAddresses(listenPort: number): string[] {
  const found: string[] = [];
  for (const file of ['/proc/net/tcp', '/proc/net/tcp6']) {
    if (!existsSync(file)) continue;
    for (const line of readFileSync(file, 'utf8').split('\n').slice(1)) {
      const fields = line.trim().split(/\s+/);
      const [local, , state] = [fields[1], fields[2], fields[3]];
      if (!local || state !== '0A') continue; // 0A = TCP_LISTEN
      const [hexAddress = '', hexPort = ''] = local.split(':');
      if (parseInt(hexPort, 16) !== listenPort) continue;
      if (hexAddress.length === 8) {
        // IPv4, little-endian bytes.
        found.push([3, 2, 1, 0].map((i) => parseInt(hexAddress.slice(2 * i, 2 * i + 2), 16)).join('.'));
      } else {
        found.push(`ipv6:${hexAddress}`);
      }
    }
  }
  return found;
}

describe('demo server started as npm start runs it (demo/start.mjs)', () => {
  it('listens on 127.0.0.1 only, as the kernel reports the socket', () => {
    expect(process.platform).toBe('linux');
    expect(listeningAddresses(port)).toEqual(['127.0.0.1']);
  });

  it('serves the console page, its stylesheet and its bundled script', async () => {
    const page = await get('/demo/index.html');
    expect(page.status).toBe(200);
    expect(page.text).toMatch(/content-type: text\/html/i);
    expect(page.text).toContain('src="./dist/console.js"');
    expect((await get('/demo/console.css')).status).toBe(200);
    const script = await get('/demo/dist/console.js');
    expect(script.status).toBe(200);
    expect(script.text).toMatch(/content-type: text\/javascript/i);
    expect(script.text).toMatch(/x-content-type-options: nosniff/i);
    expect((await get('/demo/stress.html')).status).toBe(200);
  });

  it('redirects / to the console page', async () => {
    const root = await get('/');
    expect(root.status).toBe(302);
    expect(root.text).toMatch(/location: \/demo\/index\.html/i);
  });

  const outside = [
    '/.git/config',
    '/.git/HEAD',
    '/package.json',
    '/README.md',
    '/node_modules/lit/index.js',
    '/packages/sdk/src/index.ts',
    '/packages/sdk/dist/index.js',
    '/demo/start.mjs',
    '/demo/server.mjs',
    '/demo/console.js',
    '/__wds-outside-root__/10/etc/passwd',
    '/__wds-outside-root__/1/package.json',
    '/demo/../package.json',
    '/demo/../.git/config',
    '/../../etc/passwd',
    '//etc/passwd',
    '/etc/passwd',
    '/demo/%2e%2e/package.json',
    '/demo/%2E%2E/.git/config',
    '/%2e%2e/%2e%2e/etc/passwd',
    '/demo/..%2fpackage.json',
    '/demo/..%2Fpackage.json',
    '/demo/%252e%252e/package.json',
    '/demo/..%5cpackage.json',
    '/demo\\..\\package.json',
    '/demo/dist/../../package.json',
    '/demo/dist/%2e%2e/%2e%2e/.git/config',
    '/demo/index.html%00.js',
    '/demo/./index.html',
    '/demo//index.html',
    '/DEMO/INDEX.HTML',
    '/demo/dist/',
    '/demo/dist',
    '/demo/%69ndex.html',
    '/demo/dist/console.js/..',
    '/demo/dist/..%c0%afpackage.json',
  ];
  it.each(outside)('answers 404 for %s', async (path) => {
    const answer = await get(path);
    expect(answer.status).toBe(404);
    expect(answer.text).not.toMatch(/root:|\[core\]|"workspaces"|ref: refs/);
  });

  it('serves the same page with a query string, and localhost as Host', async () => {
    expect((await get('/demo/index.html?sat=1')).status).toBe(200);
    expect((await get('/demo/index.html', `localhost:${port}`)).status).toBe(200);
  });

  it.each([
    ['a foreign name', 'attacker.example'],
    ['a foreign name with our port', 'attacker.example:PORT'],
    ['a rebinding-style name', '127.0.0.1.attacker.example:PORT'],
    ['loopback on another port', '127.0.0.1:1'],
    ['loopback without a port', '127.0.0.1'],
    ['localhost without a port', 'localhost'],
    ['the wildcard address', '0.0.0.0:PORT'],
  ])('refuses a request whose Host is %s', async (_what, host) => {
    const answer = await get('/demo/index.html', host.replace('PORT', String(port)));
    expect(answer.status).toBe(403);
    expect(answer.text).not.toContain('<html');
  });

  it('refuses a request without a Host header', async () => {
    const answer = await raw('GET /demo/index.html HTTP/1.0\r\n\r\n');
    expect(answer.status).toBe(403);
  });

  it('answers only GET and HEAD', async () => {
    const post = await raw(
      `POST /demo/index.html HTTP/1.1\r\nHost: 127.0.0.1:${port}\r\nContent-Length: 0\r\nConnection: close\r\n\r\n`,
    );
    expect(post.status).toBe(405);
    const head = await raw(`HEAD /demo/index.html HTTP/1.1\r\nHost: 127.0.0.1:${port}\r\nConnection: close\r\n\r\n`);
    expect(head.status).toBe(200);
    expect(head.text).not.toContain('<html');
  });
});
