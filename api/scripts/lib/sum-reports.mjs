// Totals the suites of api/scripts/test-all.sh from their vitest / jest JSON reports.
// Usage: node sum-reports.mjs RESULTS_TSV
// Each line of RESULTS_TSV: name \t state \t report-path \t exit-code \t seconds \t note
//   state: ran | skipped | not-run (a step it needed failed; note says which) | failed (a build)
// Prints one line per suite, the failing tests, and as the very last line `N passed, N failed`.
// Exit code: 0 when nothing failed, 1 otherwise.
import { existsSync, readFileSync } from 'node:fs';
import { relative } from 'node:path';

const [resultsFile] = process.argv.slice(2);
if (!resultsFile) {
  console.error('usage: sum-reports.mjs RESULTS_TSV');
  process.exit(64);
}

const lines = existsSync(resultsFile)
  ? readFileSync(resultsFile, 'utf8')
      .split('\n')
      .filter((l) => l.trim() !== '')
  : [];

let passed = 0;
let failed = 0;
const rows = [];
const failures = [];

function readReport(path) {
  if (!path || !existsSync(path)) return { error: 'wrote no report' };
  try {
    const r = JSON.parse(readFileSync(path, 'utf8'));
    if (typeof r.numPassedTests !== 'number' || typeof r.numFailedTests !== 'number') {
      return { error: 'report has no numPassedTests / numFailedTests' };
    }
    return { report: r };
  } catch (err) {
    return { error: `report is not valid JSON (${err.message})` };
  }
}

for (const line of lines) {
  const [name, state, reportPath, exitCode, seconds, note = ''] = line.split('\t');
  const time = seconds ? ` (${seconds} s)` : '';
  if (state === 'skipped') {
    rows.push(`  ${name.padEnd(8)} skipped (${note || 'not present'})`);
    continue;
  }
  if (state === 'failed') {
    failed += 1;
    rows.push(`  ${name.padEnd(8)} FAILED: ${note} (counted as 1 failure)`);
    continue;
  }
  if (state === 'not-run') {
    failed += 1;
    rows.push(`  ${name.padEnd(8)} FAILED, not run: ${note} (counted as 1 failure)`);
    continue;
  }
  const { report, error } = readReport(reportPath);
  if (!report) {
    failed += 1;
    rows.push(
      `  ${name.padEnd(8)} FAILED: exited ${exitCode} and ${error} (counted as 1 failure)${time}`,
    );
    continue;
  }
  let p = report.numPassedTests;
  let f = report.numFailedTests;
  const skippedTests = (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0);
  let extra = '';
  if (report.numTotalTests === 0) {
    f = 1;
    extra = `; ran no test${exitCode !== '0' ? ` (exit ${exitCode}: no test files found?)` : ''} (counted as 1 failure)`;
  } else if (exitCode !== '0' && f === 0) {
    // Crashed files, unhandled errors, or no tests found: the runner failed without a failing test.
    f = 1;
    const brokenFiles = (report.testResults ?? []).filter((t) => t.status === 'failed').length;
    extra = brokenFiles
      ? `; ${brokenFiles} test file(s) failed to run (counted as 1 failure)`
      : `; runner exited ${exitCode} without a failing test (counted as 1 failure)`;
  }
  passed += p;
  failed += f;
  rows.push(
    `  ${name.padEnd(8)} ${p} passed, ${f} failed${skippedTests ? `, ${skippedTests} skipped` : ''}${extra}${time}`,
  );
  for (const file of report.testResults ?? []) {
    const fileName = file.name ? relative(process.cwd(), file.name) : '?';
    const failedTests = (file.assertionResults ?? []).filter((a) => a.status === 'failed');
    for (const a of failedTests) failures.push(`  ${name}: ${fileName} › ${a.fullName ?? a.title}`);
    if (file.status === 'failed' && failedTests.length === 0) {
      const msg = (file.message ?? '').split('\n').find((l) => l.trim() !== '') ?? 'failed to run';
      failures.push(`  ${name}: ${fileName} › ${msg.trim().slice(0, 200)}`);
    }
  }
}

console.log('\nTest suites:');
for (const row of rows) console.log(row);
if (failures.length) {
  console.log('\nFailing tests:');
  for (const f of failures.slice(0, 40)) console.log(f);
  if (failures.length > 40)
    console.log(`  … and ${failures.length - 40} more (see .local/test-reports/)`);
}
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed > 0 ? 1 : 0);
