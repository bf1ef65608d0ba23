import { execFile } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { promisify } from "node:util";
import knexFactory from "knex";
import { afterAll, describe, expect, it } from "vitest";
import { repoRoot } from "@/config/env";
import { db } from "@/db/knex";
import { startTempPostgres } from "../../../docker-free-scripts/lib/temp-postgres.mjs";
import { createCorpusWithTypes } from "./support/corpora";
import { signUpFounder, startTestServer } from "./support/http";

const run = promisify(execFile);
const script = path.join(repoRoot, "docker-free-scripts", "backup.sh");
const work = fs.mkdtempSync(path.join(os.tmpdir(), "tagloom-backup-test-"));
if (process.getuid?.() === 0) fs.chmodSync(work, 0o777);
afterAll(() => fs.rmSync(work, { recursive: true, force: true }));

const backup = (args: string[], url: string) => run("bash", [script, ...args], { env: { ...process.env, DATABASE_URL: url }, timeout: 120_000 });

/** Every row of the tables a customer's data lives in, in a stable order. */
async function snapshot(k: typeof db): Promise<Record<string, unknown[]>> {
  const out: Record<string, unknown[]> = {};
  for (const table of ["organizations", "auth_user", "user_session", "memberships", "corpora", "entity_types", "audit_events"]) {
    out[table] = await k(table).select("*").orderByRaw("1");
  }
  return out;
}

describe("backup.sh", () => {
  it("dumps the database and restores it into a fresh cluster with the same rows", async () => {
    const server = await startTestServer();
    const admin = await signUpFounder(server, { organizationName: "Wendle Backup Trust" });
    await createCorpusWithTypes(admin.agent, admin.orgId, "Kept corpus", ["PARTY", "PLACE"]);
    const url = process.env.DATABASE_URL!;
    const file = path.join(work, "tagloom.dump");
    const dumped = await backup(["dump", file], url);
    expect(dumped.stdout).toMatch(/dumped postgres:\/\/tagloom:\*\*\*@/);
    expect(dumped.stdout).not.toContain(":tagloom@");

    const fresh = await startTempPostgres({ label: "restore" });
    const restored = knexFactory({ client: "pg", connection: fresh.url, pool: { min: 0, max: 1 } });
    try {
      await backup(["restore", file], fresh.url);
      const before = await snapshot(db);
      expect(before.organizations!.length).toBeGreaterThan(0);
      expect((before.corpora as Array<{ name: string }>).map((c) => c.name)).toContain("Kept corpus");
      expect(await snapshot(restored)).toEqual(before);
      // A second restore would overwrite: refused, and the rows are still there once.
      const again = await backup(["restore", file], fresh.url).catch((e: { stderr: string; code: number }) => e);
      expect((again as { code: number }).code).toBe(1);
      expect((again as { stderr: string }).stderr).toMatch(/already holds \d+ tables; restore into an empty database/);
      expect(await snapshot(restored)).toEqual(before);
    } finally {
      await restored.destroy();
      fresh.stop();
    }
  }, 180_000);

  it("refuses a file that is not a dump", async () => {
    const bogus = path.join(work, "not-a-dump.dump");
    fs.writeFileSync(bogus, "hello");
    const res = await backup(["restore", bogus], process.env.DATABASE_URL!).catch((e: { stderr: string; code: number }) => e);
    expect((res as { code: number }).code).toBe(1);
    expect((res as { stderr: string }).stderr).toMatch(/is not a dump made by backup.sh dump/);
  });
});
