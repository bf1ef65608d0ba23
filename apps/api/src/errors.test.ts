import { describe, expect, it } from "vitest";
import { isDatabaseUnavailable } from "./errors";

// Messages as node-postgres 8 words them (pg/lib/client.js), with the SQL prefix Knex 3 adds to
// a failed query's message; codes from the PostgreSQL manual, appendix A (error codes).
describe("isDatabaseUnavailable", () => {
  it("knows a cut connection, with or without the SQL in front", () => {
    expect(isDatabaseUnavailable(new Error("Connection terminated unexpectedly"))).toBe(true);
    expect(isDatabaseUnavailable(new Error('select "m"."role" from "memberships" as "m" where "m"."user_id" = $1 - Connection terminated unexpectedly'))).toBe(true);
    expect(isDatabaseUnavailable(new Error("update \"assignments\" set \"version\" = version + 1 - Client has encountered a connection error and is not queryable"))).toBe(true);
    expect(isDatabaseUnavailable(Object.assign(new Error("terminating connection due to administrator command"), { code: "57P01" }))).toBe(true);
    expect(isDatabaseUnavailable(Object.assign(new Error("connect ECONNREFUSED 127.0.0.1:5432"), { code: "ECONNREFUSED" }))).toBe(true);
  });

  it("does not take a wrong query or a text that merely mentions a connection for an outage", () => {
    expect(isDatabaseUnavailable(Object.assign(new Error('select 1 - syntax error at or near "selec"'), { code: "42601" }))).toBe(false);
    expect(isDatabaseUnavailable(Object.assign(new Error("insert - duplicate key value violates unique constraint"), { code: "23505" }))).toBe(false);
    expect(isDatabaseUnavailable(new Error("select 'Connection terminated' as note - invalid input syntax"))).toBe(false);
    expect(isDatabaseUnavailable(null)).toBe(false);
  });
});
