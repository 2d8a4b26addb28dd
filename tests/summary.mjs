// Prints one closing line for the whole test command from the vitest JSON reports.
import fs from 'node:fs';

let passed = 0;
let failed = 0;
let skipped = 0;
for (const file of ['tests/results/unit.json', 'tests/results/e2e.json']) {
  const report = JSON.parse(fs.readFileSync(file, 'utf8'));
  passed += report.numPassedTests;
  failed += report.numFailedTests;
  skipped += report.numPendingTests + report.numTodoTests;
}
console.log(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`);
process.exit(failed > 0 || passed === 0 ? 1 : 0);
