// Prints one closing line for the whole run, from vitest's and Playwright's JSON reports:
// "tests: N passed, N failed" (", N skipped" when any were skipped).
import { existsSync, readFileSync } from "node:fs";

const [vitestFile, playwrightFile] = process.argv.slice(2);
let passed = 0;
let failed = 0;
let skipped = 0;

if (vitestFile && existsSync(vitestFile)) {
  const v = JSON.parse(readFileSync(vitestFile, "utf8"));
  passed += v.numPassedTests ?? 0;
  failed += (v.numFailedTests ?? 0) + (v.numFailedTestSuites && !v.numFailedTests ? v.numFailedTestSuites : 0);
  skipped += (v.numPendingTests ?? 0) + (v.numTodoTests ?? 0);
}
if (playwrightFile && existsSync(playwrightFile)) {
  const p = JSON.parse(readFileSync(playwrightFile, "utf8"));
  passed += (p.stats?.expected ?? 0) + (p.stats?.flaky ?? 0);
  failed += p.stats?.unexpected ?? 0;
  skipped += p.stats?.skipped ?? 0;
}
console.log(`tests: ${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ""}`);
