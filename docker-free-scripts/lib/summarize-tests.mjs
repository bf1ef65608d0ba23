// Sums vitest JSON reports into the line `npm test` ends with (tests only):
//   N passed, N failed, N skipped
// Static checks (type check, lint) are not tests: each gets its own line just before it,
// "typecheck: ok" or "typecheck: failed (exit 2)", and a failed one makes the exit code non-zero.
// Arguments: `--check=<name>=<exit code>` for a static check, `<name>=<report.json>=<exit code>`
// for a vitest suite. A suite that crashed before writing its report counts as one failure.
import fs from "node:fs";

const [, , ...args] = process.argv;
let passed = 0;
let failed = 0;
let skipped = 0;
const rows = [];
const checks = [];
for (const arg of args) {
  if (arg.startsWith("--check=")) {
    const [name, exitCode] = arg.slice("--check=".length).split("=");
    checks.push({ name, ok: exitCode === "0", exitCode });
    continue;
  }
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
for (const c of checks) console.log(`${c.name}: ${c.ok ? "ok" : `failed (exit ${c.exitCode})`}`);
console.log(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ""}`);
process.exit(failed > 0 || checks.some((c) => !c.ok) ? 1 : 0);
