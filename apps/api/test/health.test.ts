import request from "supertest";
import { describe, expect, it } from "vitest";
import { createApp } from "@/app";

const app = createApp();

describe("GET /api/health", () => {
  it("answers ok with the database up after a real query", async () => {
    const res = await request(app).get("/api/health");
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ ok: true, db: "up" });
    expect(res.headers["x-request-id"]).toMatch(/^[\w-]+$/);
  });

  it("keeps a well-formed incoming request id", async () => {
    const res = await request(app).get("/api/health").set("X-Request-Id", "abc-123");
    expect(res.headers["x-request-id"]).toBe("abc-123");
  });
});

describe("errors", () => {
  it("answers an unknown API route with a JSON 404", async () => {
    const res = await request(app).get("/api/no-such-thing");
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe("not_found");
    expect(res.body.error.message).toContain("/api/no-such-thing");
  });

  it("answers malformed JSON with a 400 and no internals", async () => {
    const res = await request(app).post("/api/health").set("Content-Type", "application/json").send("{nope");
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe("bad_request");
    expect(JSON.stringify(res.body)).not.toContain("SyntaxError");
  });
});
