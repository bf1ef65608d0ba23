/**
 * The totals that `npm test` ends with (docker-free-scripts/lib/summarize-tests.mjs): the type
 * check and lint get lines of their own, the last line counts tests only, and a failed check, a
 * failed test or a crashed suite makes the exit code non-zero. The script runs on the machine's
 * Node with report files written here.
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { afterAll, describe, expect, it } from "vitest";

const script = fileURLToPath(new URL("../../../docker-free-scripts/lib/summarize-tests.mjs", import.meta.url));
const dir = mkdtempSync(join(tmpdir(), "tagloom-totals-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function report(name: string, passed: number, failed: number, pending = 0): string {
  const file = join(dir, `${name}.json`);
  writeFileSync(file, JSON.stringify({ numPassedTests: passed, numFailedTests: failed, numPendingTests: pending, numTodoTests: 0, testResults: [] }));
  return file;
}

function summarize(args: string[]): { code: number | null; lines: string[] } {
  const run = spawnSync(process.execPath, [script, ...args], { encoding: "utf8" });
  return { code: run.status, lines: run.stdout.trimEnd().split("\n") };
}

describe("test totals", () => {
  it("prints the checks on their own lines and counts only tests in the last line", () => {
    const { code, lines } = summarize(["--check=typecheck=0", "--check=lint=0", `tagger=${report("a", 40, 0, 2)}=0`, `api=${report("b", 7, 0)}=0`]);
    expect(code).toBe(0);
    expect(lines.slice(-3)).toEqual(["typecheck: ok", "lint: ok", "47 passed, 0 failed, 2 skipped"]);
    expect(lines).toContain("  tagger: 40 passed, 0 failed, 2 skipped");
  });

  it("fails the run when the type check or lint fails, without counting it as a test", () => {
    const typecheck = summarize(["--check=typecheck=2", "--check=lint=0", `api=${report("c", 5, 0)}=0`]);
    expect(typecheck.code).toBe(1);
    expect(typecheck.lines.slice(-3)).toEqual(["typecheck: failed (exit 2)", "lint: ok", "5 passed, 0 failed"]);
    const lint = summarize(["--check=typecheck=0", "--check=lint=1", `api=${report("d", 5, 0)}=0`]);
    expect(lint.code).toBe(1);
    expect(lint.lines.slice(-2)).toEqual(["lint: failed (exit 1)", "5 passed, 0 failed"]);
  });

  it("counts a failed test, a crashed suite and a suite that exited non-zero with no failed test", () => {
    const { code, lines } = summarize(["--check=typecheck=0", "--check=lint=0", `a=${report("e", 3, 1)}=1`, `b=${join(dir, "missing.json")}=134`, `c=${report("f", 2, 0)}=1`]);
    expect(code).toBe(1);
    expect(lines).toContain("  b: no report (the suite crashed; exit 134)");
    expect(lines).toContain("  c: 2 passed, 1 failed (vitest exited 1)");
    expect(lines.at(-1)).toBe("5 passed, 3 failed");
  });
});
