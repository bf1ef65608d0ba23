import request from "supertest";
import { describe, expect, it } from "vitest";

describe("the dev Outbox in production mode", () => {
  it("is refused and the meta route says it is off", async () => {
    process.env.NODE_ENV = "production";
    process.env.COOKIE_SECURE = "false";
    const { createApp } = await import("@/app");
    const app = createApp();
    const outbox = await request(app).get("/api/dev/outbox");
    expect(outbox.status).toBe(404);
    const meta = await request(app).get("/api/meta");
    expect(meta.body).toEqual({ environment: "production", outbox: false });
  });
});
