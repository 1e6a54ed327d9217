// `npm test`: every check in order, then one plain closing line "N passed, N failed".
// Gates (types, lint, build) count as one check each; unit and browser tests are read from their JSON
// reports because neither Vitest's nor Playwright's own summary line is in the plain form.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';

const results = { passed: 0, failed: 0 };
const lines = [];
function run(label, command) {
  const started = Date.now();
  const r = spawnSync(command, { shell: true, stdio: 'inherit' });
  const seconds = ((Date.now() - started) / 1000).toFixed(1);
  return { ok: r.status === 0, seconds, label };
}
function gate(label, command) {
  const r = run(label, command);
  if (r.ok) results.passed += 1;
  else results.failed += 1;
  lines.push(`${label}: ${r.ok ? 'ok' : 'FAILED'} (${r.seconds} s)`);
  return r.ok;
}
function readJson(path) {
  try {
    return JSON.parse(readFileSync(path, 'utf8'));
  } catch {
    return null;
  }
}

mkdirSync('test-results', { recursive: true });
rmSync('test-results/unit.json', { force: true });
rmSync('test-results/e2e.json', { force: true });

gate('typecheck', 'npm run -s typecheck');
gate('lint+format', 'npm run -s lint');
gate('build cli', 'npm run -s build:cli');
// the crew server (src/server): its tests and the two-phone browser test run the built server
gate('build server', 'npm run -s build:server');

const unit = run('unit', 'npm run -s test:unit');
const u = readJson('test-results/unit.json');
if (u) {
  results.passed += u.numPassedTests;
  results.failed += u.numFailedTests;
  // A file that fails to load has no tests but still fails the run.
  const brokenFiles = (u.testResults ?? []).filter(
    (f) => f.status === 'failed' && f.assertionResults.length === 0,
  ).length;
  results.failed += brokenFiles;
  lines.push(
    `unit: ${u.numPassedTests} passed, ${u.numFailedTests + brokenFiles} failed (${unit.seconds} s)`,
  );
} else {
  results.failed += 1;
  lines.push('unit: no report (vitest did not run)');
}

const built = gate('build app', 'npm run -s build') && existsSync('dist/sw.js');
if (built) gate('shell size budget', 'node .ci/size-check.mjs');
if (built) {
  const e2e = run('e2e', 'npm run -s test:e2e');
  const e = readJson('test-results/e2e.json');
  if (e?.stats) {
    const passed = e.stats.expected + e.stats.flaky;
    const failed = e.stats.unexpected;
    results.passed += passed;
    results.failed += failed;
    lines.push(
      `e2e: ${passed} passed, ${failed} failed${e.stats.flaky ? ` (${e.stats.flaky} flaky)` : ''} (${e2e.seconds} s)`,
    );
    if (!e2e.ok && failed === 0) {
      results.failed += 1;
      lines.push('e2e: playwright exited with an error');
    }
  } else {
    results.failed += 1;
    lines.push('e2e: no report (playwright did not run)');
  }
} else {
  lines.push('e2e: skipped because the build failed or dist/sw.js is missing');
  results.failed += 1;
}

console.log('');
for (const line of lines) console.log(line);
console.log(`${results.passed} passed, ${results.failed} failed`);
process.exit(results.failed > 0 || results.passed === 0 ? 1 : 0);
