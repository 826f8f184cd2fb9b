// Runs every check in order and ends with one line CI can read: "N passed, N failed".
// A step without test counts (lint, types, build) counts as one check.
import { spawnSync } from 'node:child_process';
import { mkdirSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';

const out = join('test-results');
rmSync(out, { recursive: true, force: true });
mkdirSync(out, { recursive: true });

const steps = [
  { name: 'lint', cmd: ['npx', 'eslint', '.', '--max-warnings=0'] },
  { name: 'formatting', cmd: ['npx', 'prettier', '--check', '.', '--log-level=warn'] },
  { name: 'types', cmd: ['npm', 'run', '--silent', 'typecheck'] },
  {
    name: 'domain and web unit tests (with domain coverage)',
    vitest: ['--project', 'domain', '--project', 'web', '--coverage'],
  },
  { name: 'API tests against PostgreSQL', vitest: ['--project', 'api'] },
  // Built as it ships: the checks run with NODE_ENV=test, which would give the journeys React's
  // development bundle (220 kB gzip instead of 155 kB, and other code paths).
  { name: 'build', cmd: ['npm', 'run', '--silent', 'build'], env: { NODE_ENV: 'production' } },
  { name: 'browser journeys in Chromium', vitest: ['--project', 'browser'] },
];

let passed = 0;
let failed = 0;
const failures = [];
// The failing tests by name, with the start of their message, repeated at the very end: a CI log that
// keeps only its tail still says which test failed and why.
const failedTests = [];
for (const [i, step] of steps.entries()) {
  console.log(`\n=== ${step.name} ===`);
  const report = join(out, `vitest-${i}.json`);
  const cmd = step.vitest
    ? ['npx', 'vitest', 'run', ...step.vitest, '--reporter=default', '--reporter=json', `--outputFile.json=${report}`]
    : step.cmd;
  const run = spawnSync(cmd[0], cmd.slice(1), { stdio: 'inherit', env: { ...process.env, ...step.env } });
  if (step.vitest) {
    let counts;
    try {
      counts = JSON.parse(readFileSync(report, 'utf8'));
    } catch {
      counts = null;
    }
    if (counts) {
      passed += counts.numPassedTests;
      failed += counts.numFailedTests;
      failedTests.push(...failedTestsOf(counts));
    }
    if (run.status !== 0) {
      failures.push(step.name);
      if (!counts || counts.numFailedTests === 0) failed += 1;
    }
  } else if (run.status === 0) {
    passed += 1;
  } else {
    failed += 1;
    failures.push(step.name);
  }
}
if (failedTests.length) {
  console.log('\nfailed tests:');
  for (const line of failedTests) console.log(line);
}
if (failures.length) console.log(`\nfailed steps: ${failures.join('; ')}`);
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed === 0 ? 0 : 1);

/** One entry per failed test (or file that failed before its tests ran): its place, name and first lines. */
function failedTestsOf(report) {
  const lines = [];
  const firstLines = (message) =>
    String(message ?? '')
      .split('\n')
      .filter((line) => line.trim())
      .slice(0, 4)
      .map((line) => `      ${line.trim()}`)
      .join('\n');
  for (const file of report.testResults ?? []) {
    const where = file.name.replace(`${process.cwd()}/`, '');
    const failedHere = (file.assertionResults ?? []).filter((test) => test.status === 'failed');
    for (const test of failedHere) {
      lines.push(`  ✗ ${where} › ${test.fullName}\n${firstLines(test.failureMessages?.[0])}`);
    }
    if (failedHere.length === 0 && file.status === 'failed') {
      lines.push(`  ✗ ${where} (the file failed before or after its tests)\n${firstLines(file.message)}`);
    }
  }
  return lines;
}
