// Sums vitest JSON reports into the one line `npm test` ends with:
//   N passed, N failed, N skipped
// A suite that crashed before writing its report counts as one failure.
import fs from "node:fs";

const [, , ...args] = process.argv;
let passed = 0;
let failed = 0;
let skipped = 0;
const rows = [];
for (const arg of args) {
  const [name, file, exitCode] = arg.split("=");
  let r = null;
  try {
    r = JSON.parse(fs.readFileSync(file, "utf8"));
  } catch {
    r = null;
  }
  if (!r) {
    failed += 1;
    rows.push(`${name}: no report (the suite crashed; exit ${exitCode})`);
    continue;
  }
  const p = r.numPassedTests ?? 0;
  // Files that failed to load count as failures even when no test in them ran.
  const loadFailures = (r.testResults ?? []).filter((t) => t.status === "failed" && (t.assertionResults ?? []).length === 0).length;
  const f = (r.numFailedTests ?? 0) + loadFailures;
  const s = (r.numPendingTests ?? 0) + (r.numTodoTests ?? 0);
  const suiteFailed = f === 0 && exitCode !== "0" ? 1 : 0;
  passed += p;
  failed += f + suiteFailed;
  skipped += s;
  rows.push(`${name}: ${p} passed, ${f + suiteFailed} failed${s ? `, ${s} skipped` : ""}${suiteFailed ? ` (vitest exited ${exitCode})` : ""}`);
}
console.log("");
for (const row of rows) console.log(`  ${row}`);
console.log("");
console.log(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ""}`);
process.exit(failed > 0 ? 1 : 0);
