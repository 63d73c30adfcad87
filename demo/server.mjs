// The demo console's static server (`npm start`, `npm run screenshot`, the browser benchmark).
//
// It serves a fixed list of files and nothing else: the two demo pages, their stylesheet and the
// bundles rollup writes to demo/dist/ (the console's scripts with the built packages and Lit
// inlined). The list is made once at start-up from those folders; a request path is looked up in
// it as the exact bytes received, never decoded or joined to a directory, so no spelling of "..",
// no percent-encoding and no absolute path can reach another file. Only the loopback interface is
// bound, and a request whose Host header is not 127.0.0.1:<port> or localhost:<port> is refused,
// which closes the page to DNS rebinding. Only GET and HEAD are answered.

import { readdirSync, readFileSync, statSync } from 'node:fs';
import { createServer } from 'node:http';
import { extname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const DEMO = fileURLToPath(new URL('.', import.meta.url));

/** The loopback address the server binds; never a wildcard address. */
export const DEMO_HOST = '127.0.0.1';

const CONTENT_TYPES = {
  '.html': 'text/html; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.map': 'application/json; charset=utf-8',
};

/** Pages and stylesheets served from demo/ itself; scripts come only from demo/dist/. */
const PAGES = ['index.html', 'stress.html', 'console.css'];

/**
 * The served files: URL path → absolute file path and content type. demo/dist/ must exist (rollup
 * writes it); a missing page or an empty dist/ is an error at start-up, not a 404 later.
 */
export function servedFiles(demoFolder = DEMO) {
  const files = new Map();
  for (const name of PAGES) {
    files.set(`/demo/${name}`, { path: join(demoFolder, name), type: CONTENT_TYPES[extname(name)] });
  }
  const dist = join(demoFolder, 'dist');
  let built = [];
  try {
    built = readdirSync(dist).filter((name) => CONTENT_TYPES[extname(name)] && statSync(join(dist, name)).isFile());
  } catch {
    built = [];
  }
  if (!built.includes('console.js')) {
    throw new Error(`the demo bundle ${join(dist, 'console.js')} is missing: run "npm run build" first`);
  }
  for (const name of built)
    files.set(`/demo/dist/${name}`, { path: join(dist, name), type: CONTENT_TYPES[extname(name)] });
  for (const { path } of files.values()) statSync(path); // a missing page fails here, at start-up
  return files;
}

const SECURITY_HEADERS = {
  'X-Content-Type-Options': 'nosniff',
  'Referrer-Policy': 'no-referrer',
  'Cross-Origin-Resource-Policy': 'same-origin',
  'Cache-Control': 'no-store',
  'Content-Security-Policy':
    "default-src 'self'; script-src 'self'; style-src 'self' 'unsafe-inline'; img-src 'self' data:; " +
    "object-src 'none'; base-uri 'none'; form-action 'none'; frame-ancestors 'self'",
};

function reply(response, status, text, extraHeaders = {}) {
  response.writeHead(status, { ...SECURITY_HEADERS, 'Content-Type': 'text/plain; charset=utf-8', ...extraHeaders });
  response.end(`${text}\n`);
}

/** True when `host` (the Host header) names this server on the loopback interface, exactly. */
export function isAllowedHost(host, port) {
  if (typeof host !== 'string') return false;
  const h = host.toLowerCase();
  return h === `127.0.0.1:${port}` || h === `localhost:${port}`;
}

/**
 * Starts the server on 127.0.0.1:`port` (0 picks a free port). Resolves with `{ server, port, url,
 * close }` once it listens; rejects with the listen error (e.g. EADDRINUSE).
 */
export function startDemoServer({ port = 8000, demoFolder = DEMO } = {}) {
  const files = servedFiles(demoFolder);
  const server = createServer((request, response) => {
    const actualPort = server.address().port;
    if (!isAllowedHost(request.headers.host, actualPort)) {
      reply(response, 403, `refused: the Host header must be 127.0.0.1:${actualPort} or localhost:${actualPort}`);
      return;
    }
    if (request.method !== 'GET' && request.method !== 'HEAD') {
      reply(response, 405, 'only GET and HEAD are served', { Allow: 'GET, HEAD' });
      return;
    }
    const raw = request.url ?? '';
    const path = raw.split('?', 1)[0];
    if (path === '/' || path === '/demo' || path === '/demo/') {
      reply(response, 302, 'see /demo/index.html', { Location: '/demo/index.html' });
      return;
    }
    const file = files.get(path);
    if (!file) {
      reply(response, 404, 'not found');
      return;
    }
    let body;
    try {
      body = readFileSync(file.path);
    } catch {
      reply(response, 404, 'not found');
      return;
    }
    response.writeHead(200, { ...SECURITY_HEADERS, 'Content-Type': file.type, 'Content-Length': body.length });
    response.end(request.method === 'HEAD' ? undefined : body);
  });
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen({ port, host: DEMO_HOST, exclusive: true }, () => {
      server.off('error', reject);
      const { address, port: bound } = server.address();
      if (address !== DEMO_HOST) {
        server.close();
        reject(new Error(`the demo server bound ${address}, not ${DEMO_HOST}; refusing to serve`));
        return;
      }
      resolve({
        server,
        port: bound,
        url: `http://${DEMO_HOST}:${bound}/demo/index.html`,
        close: () =>
          new Promise((done) => {
            server.closeAllConnections();
            server.close(() => done());
          }),
      });
    });
  });
}
