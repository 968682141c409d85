// npm test: every tier, in order — lint and types, common unit tests, API tests against the real
// PostgreSQL, component tests, a production build, and browser journeys in Debian's Chromium against
// that build. Ends with one line: "Tests: N passed, N failed".
import { mkdirSync, readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import { REPO, log } from './lib/env.mjs';
import { startPostgres, stopPostgres } from './lib/postgres.mjs';
import { ensureChromium } from './lib/chromium.mjs';
import { runVisible } from './lib/run.mjs';

const results = path.join(REPO, 'backend', '.test-results');
rmSync(results, { recursive: true, force: true });
mkdirSync(results, { recursive: true });

const failedSteps = [];
const testRuns = new Set();
const tiers = [];
let passed = 0;
let failed = 0;

async function step(name, cmd, args, cwd = REPO) {
  log(`── ${name}`);
  const started = Date.now();
  const code = await runVisible(cmd, args, { cwd, env: { ...process.env, FORCE_COLOR: '0' } });
  if (code !== 0) failedSteps.push(name);
  log(
    `   ${name}: ${code === 0 ? 'ok' : `FAILED (exit ${code})`} in ${((Date.now() - started) / 1000).toFixed(0)} s`,
  );
  return code === 0;
}

async function vitest(name, workspace, extra = []) {
  testRuns.add(name);
  const out = path.join(results, `${name.replace(/\W+/g, '-')}.json`);
  const ok = await step(
    name,
    'npx',
    ['vitest', 'run', '--reporter=default', '--reporter=json', `--outputFile.json=${out}`, ...extra],
    path.join(REPO, workspace),
  );
  try {
    const r = JSON.parse(readFileSync(out, 'utf8'));
    passed += r.numPassedTests;
    failed += r.numFailedTests;
    tiers.push(`${name}: ${r.numPassedTests} passed, ${r.numFailedTests} failed`);
    if (r.numTotalTests === 0) failedSteps.push(`${name} ran no test`);
  } catch {
    tiers.push(`${name}: no results (the runner did not finish)`);
    if (ok) failedSteps.push(`${name} wrote no results`);
  }
}

const pg = await startPostgres();
try {
  await step('lint (eslint)', 'npx', ['eslint', '.', '--max-warnings=0']);
  await step('format (prettier --check)', 'npx', ['prettier', '--check', '.', '--log-level', 'warn']);
  await step('build common', 'npm', ['run', 'build', '-w', 'common']);
  await step('types (backend)', 'npm', ['run', 'typecheck', '-w', 'backend']);
  await step('types (frontend)', 'npm', ['run', 'typecheck', '-w', 'frontend']);
  await vitest('common unit tests', 'common');
  await vitest('API tests (PostgreSQL)', 'backend');
  await vitest('component tests', 'frontend');
  const built =
    (await step('build backend', 'npm', ['run', 'build', '-w', 'backend'])) &&
    (await step('build frontend', 'npm', ['run', 'build', '-w', 'frontend']));
  if (built) {
    ensureChromium();
    await vitest('browser journeys (Chromium)', 'frontend', ['--config', 'e2e/vitest.config.mts']);
  } else {
    failedSteps.push('browser journeys skipped: the build failed');
  }
} finally {
  if (pg.started) await stopPostgres();
}

console.log('\n──────── Loambook test summary ────────');
for (const t of tiers) console.log(`  ${t}`);
for (const s of failedSteps) console.log(`  FAILED: ${s}`);
// A failed step that is not a test run (lint, types, build) counts as one failure in the total.
const stepFailures = failedSteps.filter((s) => !testRuns.has(s)).length;
console.log(`Tests: ${passed} passed, ${failed + stepFailures} failed`);
process.exit(failedSteps.length || failed ? 1 : 0);
