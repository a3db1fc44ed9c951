// Sums the JSON reports that jest and vitest wrote (both use jest's field names) into one closing line.
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';

const dir = process.argv[2];

function formatSeconds(seconds) {
  return seconds >= 60 ? `${Math.floor(seconds / 60)} min ${String(seconds % 60).padStart(2, '0')} s` : `${seconds} s`;
}
let passed = 0;
let failed = 0;
let skipped = 0;
const expected = (process.env.KC_SUITES ?? '').split(' ').filter(Boolean);
const files = existsSync(dir) ? readdirSync(dir).filter((f) => f.endsWith('.json')) : [];
for (const suite of expected) {
  if (!files.includes(`${suite}.json`)) {
    console.log(`${suite}: no report was written (the suite crashed before reporting); counted as 1 failed`);
    failed += 1;
  }
}
for (const file of files) {
  const report = JSON.parse(readFileSync(join(dir, file), 'utf8'));
  const p = report.numPassedTests ?? 0;
  const f = report.numFailedTests ?? 0;
  const s = (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0);
  // A test file that failed to load, or whose beforeAll failed (its tests then show as skipped), has no
  // failed test in it but still failed: it counts as one.
  const brokenFiles = (report.testResults ?? []).filter((r) => r.status === 'failed' && !(r.assertionResults ?? []).some((a) => a.status === 'failed')).length;
  const suite = file.replace(/\.json$/, '');
  const secondsFile = join(dir, `${suite}.seconds`);
  const took = existsSync(secondsFile) ? `  (${formatSeconds(Number(readFileSync(secondsFile, 'utf8')))})` : '';
  console.log(`${suite.padEnd(9)} ${p} passed, ${f + brokenFiles} failed, ${s} skipped${took}`);
  passed += p;
  failed += f + brokenFiles;
  skipped += s;
}
let total = 0;
for (const suite of expected) {
  const secondsFile = join(dir, `${suite}.seconds`);
  if (existsSync(secondsFile)) total += Number(readFileSync(secondsFile, 'utf8'));
}
if (total > 0) console.log(`all suites took ${formatSeconds(total)}`);
console.log(`${passed} passed, ${failed} failed, ${skipped} skipped`);
process.exit(failed > 0 || passed === 0 ? 1 : 0);
