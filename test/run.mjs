#!/usr/bin/env node
// `npm test`: build what the suites need, run the Node suites (vitest) and the browser
// suites (@web/test-runner in headless Chromium), then print one closing line
// `N passed, N failed` summing both. Exits non-zero on any failure or missing browser.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync } from 'node:fs';

const OUT = '.ci-out';
mkdirSync(OUT, { recursive: true });

function run(cmd, args, opts = {}) {
  const r = spawnSync(cmd, args, { stdio: 'inherit', ...opts });
  return r.status ?? 1;
}

const chromium = process.env.CHROME_PATH || '/usr/bin/chromium';
if (!existsSync(chromium)) {
  console.error(
    `\nChromium was not found at ${chromium}. The browser suites need it and are never skipped.\n` +
      'Install it with:  apt-get update && apt-get install -y chromium   (or set CHROME_PATH)\n',
  );
  console.log('0 passed, 1 failed');
  process.exit(1);
}

if (run('npm', ['run', '--silent', 'build']) !== 0) {
  console.error('build failed');
  console.log('0 passed, 1 failed');
  process.exit(1);
}

if (run('npm', ['run', '--silent', 'typecheck']) !== 0) {
  console.error('typecheck failed');
  console.log('0 passed, 1 failed');
  process.exit(1);
}

// Code shape: Biome checks the formatting (120 columns) and the lint rules; function length is a
// warning there (the limits that must not regress are held by test/cross/code-shape.test.ts).
// Counted as one check so the closing line stays a sum of everything that ran.
const shapeRc = run('npx', ['biome', 'ci', '--reporter=summary', '--max-diagnostics=50']);
const shapePassed = shapeRc === 0 ? 1 : 0;
const shapeFailed = shapeRc === 0 ? 0 : 1;
if (shapeRc !== 0) console.error('format/lint check failed: run `npm run format` and `npm run lint` to see and fix it');

const vitestRc = run('npx', [
  'vitest',
  'run',
  '--reporter=default',
  '--reporter=json',
  `--outputFile=${OUT}/vitest.json`,
]);
let unitPassed = 0,
  unitFailed = 1;
try {
  const report = JSON.parse(readFileSync(`${OUT}/vitest.json`, 'utf8'));
  unitPassed = report.numPassedTests;
  // A file that fails without a failing test (an import or hook error) counts once; a failing test counts once,
  // not again for each describe block around it.
  const brokenFiles = (report.testResults ?? []).filter(
    (f) => f.status === 'failed' && !(f.assertionResults ?? []).some((a) => a.status === 'failed'),
  ).length;
  const counted = report.numFailedTests + brokenFiles;
  unitFailed = counted + (vitestRc !== 0 && counted === 0 ? 1 : 0);
} catch {
  /* no report: counted as one failure */
}

const wtr = spawnSync('npx', ['web-test-runner'], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
process.stdout.write(wtr.stdout ?? '');
process.stderr.write(wtr.stderr ?? '');
const matches = [...String(wtr.stdout).matchAll(/(\d+) passed, (\d+) failed/g)];
let browserPassed = 0,
  browserFailed = 1;
if (matches.length > 0) {
  const last = matches[matches.length - 1];
  browserPassed = Number(last[1]);
  browserFailed = Number(last[2]) + (wtr.status !== 0 && Number(last[2]) === 0 ? 1 : 0);
}

console.log(`\nformat and lint: ${shapePassed} passed, ${shapeFailed} failed`);
console.log(`node suites: ${unitPassed} passed, ${unitFailed} failed`);
console.log(`browser suites: ${browserPassed} passed, ${browserFailed} failed`);
const passed = shapePassed + unitPassed + browserPassed;
const failed = shapeFailed + unitFailed + browserFailed;
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed === 0 && vitestRc === 0 && wtr.status === 0 ? 0 : 1);
