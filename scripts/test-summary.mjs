// Prints one closing line for the whole suite, "tests: N passed, N failed", from the runners' JSON reports.
import fs from 'node:fs';

let passed = 0;
let failed = 0;
let skipped = 0;
const [vitestFile, playwrightFile] = process.argv.slice(2);

if (vitestFile && fs.existsSync(vitestFile)) {
  const v = JSON.parse(fs.readFileSync(vitestFile, 'utf8'));
  passed += v.numPassedTests ?? 0;
  failed += (v.numFailedTests ?? 0) + (v.numFailedTestSuites ?? 0);
  skipped += (v.numPendingTests ?? 0) + (v.numTodoTests ?? 0);
} else {
  failed += 1;
  console.log('no unit/API test report was written');
}

if (playwrightFile && fs.existsSync(playwrightFile)) {
  const p = JSON.parse(fs.readFileSync(playwrightFile, 'utf8'));
  passed += p.stats?.expected ?? 0;
  failed += (p.stats?.unexpected ?? 0) + (p.stats?.flaky ?? 0) + (p.errors?.length ?? 0);
  skipped += p.stats?.skipped ?? 0;
} else {
  failed += 1;
  console.log('no browser test report was written');
}

console.log(`tests: ${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`);
