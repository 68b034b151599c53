// Prints the failed tests of a jest --json result file, briefly, so the end of a long test
// log (all a CI summary may show) names what failed and why.
// Usage: node scripts/lib/jest-failures.cjs .data/jest-results.json
const fs = require('node:fs');

const file = process.argv[2];
if (!file || !fs.existsSync(file)) {
  console.log(`(no jest result file at ${file}: jest ended before writing it)`);
  process.exit(0);
}
const results = JSON.parse(fs.readFileSync(file, 'utf8'));
const MAX_MESSAGE_LINES = 12;
let shown = 0;
for (const suite of results.testResults ?? []) {
  const failed = (suite.assertionResults ?? []).filter((t) => t.status === 'failed');
  if (suite.status === 'failed' && failed.length === 0) {
    // A suite that failed outside any test (set-up, import or type error).
    console.log(`\n✗ ${suite.name}\n${firstLines(suite.message)}`);
    shown += 1;
  }
  for (const test of failed) {
    console.log(
      `\n✗ ${suite.name}\n  ${test.fullName}\n${firstLines(test.failureMessages.join('\n'))}`,
    );
    shown += 1;
  }
}
console.log(
  `\njest: ${results.numFailedTests} of ${results.numTotalTests} tests failed, ` +
    `${results.numFailedTestSuites} of ${results.numTotalTestSuites} files (${shown} shown above)`,
);

function firstLines(text) {
  return String(text ?? '')
    .replace(/\u001b\[[0-9;]*m/g, '')
    .split('\n')
    .filter((line) => line.trim() !== '')
    .slice(0, MAX_MESSAGE_LINES)
    .map((line) => `    ${line}`)
    .join('\n');
}
