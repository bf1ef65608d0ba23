import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/knex";
import { isRetryableConflict, retryOnConflict } from "./retry";

// Two transactions that update the same two rows in opposite orders deadlock; PostgreSQL aborts
// one of them (its manual, §13.3.4 "Deadlocks", gives this very example) and says the application
// should retry it. Run on this file's own database.
beforeAll(async () => {
  await db.raw("CREATE TABLE retry_probe (id int PRIMARY KEY, v int NOT NULL)");
  await db("retry_probe").insert([
    { id: 1, v: 0 },
    { id: 2, v: 0 },
  ]);
});
afterAll(async () => {
  await db.raw("DROP TABLE retry_probe");
});

/** Both first attempts hold their first row before either asks for its second: a sure deadlock. */
function crossedUpdates() {
  let arrived = 0;
  let release!: () => void;
  const both = new Promise<void>((r) => (release = r));
  const attempts = [0, 0];
  const transaction = (which: 0 | 1) => () =>
    db.transaction(async (trx) => {
      const [first, second] = which === 0 ? [1, 2] : [2, 1];
      attempts[which]! += 1;
      await trx("retry_probe").where({ id: first }).increment("v", 1);
      if (attempts[which] === 1) {
        if (++arrived === 2) release();
        await both;
      }
      await trx("retry_probe").where({ id: second }).increment("v", 1);
    });
  return { transaction, attempts };
}

describe("retryOnConflict", () => {
  it("a deadlocked transaction is aborted by PostgreSQL without retry, and completes with it", async () => {
    const bare = crossedUpdates();
    const results = await Promise.allSettled([bare.transaction(0)(), bare.transaction(1)()]);
    const failures = results.filter((r) => r.status === "rejected").map((r) => (r as PromiseRejectedResult).reason);
    expect(failures).toHaveLength(1);
    expect(isRetryableConflict(failures[0])).toBe(true);
    expect((failures[0] as { code: string }).code).toBe("40P01");
    // The aborted one changed nothing: each row was incremented by the survivor only.
    expect(await db("retry_probe").orderBy("id").pluck("v")).toEqual([1, 1]);

    const retried = crossedUpdates();
    await Promise.all([retryOnConflict(retried.transaction(0)), retryOnConflict(retried.transaction(1))]);
    expect(retried.attempts.reduce((a, b) => a + b)).toBe(3);
    expect(await db("retry_probe").orderBy("id").pluck("v")).toEqual([3, 3]);
  }, 20_000);

  it("gives up after its attempts and never retries another error", async () => {
    let calls = 0;
    const unique = Object.assign(new Error("duplicate key"), { code: "23505" });
    await expect(retryOnConflict(async () => (calls++, Promise.reject(unique)))).rejects.toBe(unique);
    expect(calls).toBe(1);
    calls = 0;
    const deadlock = Object.assign(new Error("deadlock detected"), { code: "40P01" });
    await expect(retryOnConflict(async () => (calls++, Promise.reject(deadlock)), 3)).rejects.toBe(deadlock);
    expect(calls).toBe(3);
  });
});
