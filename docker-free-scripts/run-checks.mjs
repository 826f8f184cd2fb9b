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
  { name: 'build', cmd: ['npm', 'run', '--silent', 'build'] },
  { name: 'browser journeys in Chromium', vitest: ['--project', 'browser'] },
];

let passed = 0;
let failed = 0;
const failures = [];
for (const [i, step] of steps.entries()) {
  console.log(`\n=== ${step.name} ===`);
  const report = join(out, `vitest-${i}.json`);
  const cmd = step.vitest
    ? ['npx', 'vitest', 'run', ...step.vitest, '--reporter=default', '--reporter=json', `--outputFile.json=${report}`]
    : step.cmd;
  const run = spawnSync(cmd[0], cmd.slice(1), { stdio: 'inherit', env: process.env });
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
if (failures.length) console.log(`\nfailed steps: ${failures.join('; ')}`);
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed === 0 ? 0 : 1);
