// Reads the JSON reports the suites wrote and prints one line: "N passed, N failed".
// A suite that left no report (it crashed, or did not run) counts as one failure.
import { readFileSync, existsSync } from 'node:fs';

const [, , dir, ...suites] = process.argv;
let passed = 0;
let failed = 0;
let skipped = 0;
for (const spec of suites) {
  const [name, kind] = spec.split(':');
  const file = `${dir}/${name}.json`;
  if (!existsSync(file)) {
    console.log(`  ${name}: no report (counted as 1 failed)`);
    failed += 1;
    continue;
  }
  const report = JSON.parse(readFileSync(file, 'utf8'));
  let p = 0,
    f = 0,
    s = 0;
  if (kind === 'vitest') {
    p = report.numPassedTests ?? 0;
    f = (report.numFailedTests ?? 0) + (report.success === false && !report.numFailedTests ? 1 : 0);
    s = (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0);
  } else if (kind === 'playwright') {
    p = (report.stats?.expected ?? 0) + (report.stats?.flaky ?? 0);
    f = report.stats?.unexpected ?? 0;
    s = report.stats?.skipped ?? 0;
    if ((report.errors?.length ?? 0) > 0 && f === 0) f = 1;
  } else if (kind === 'check') {
    p = report.ok ? 1 : 0;
    f = report.ok ? 0 : 1;
  }
  console.log(`  ${name}: ${p} passed, ${f} failed${s ? `, ${s} skipped` : ''}`);
  passed += p;
  failed += f;
  skipped += s;
}
console.log(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`);
process.exit(failed > 0 ? 1 : 0);
