import { beforeAll, describe, expect, it } from "vitest";
import { type TestServer, signUpFounder, startTestServer } from "./support/http";
import { startTestWorkers } from "./support/workers";

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer();
  await startTestWorkers();
});

describe("the dev Outbox in development and test mode", () => {
  it("lists the messages the mail catcher received, and shows one", async () => {
    const { email } = await signUpFounder(server);
    let items: { id: string; to: string[]; subject: string }[] = [];
    for (let i = 0; i < 60 && !items.some((m) => m.to.includes(email)); i++) {
      items = (await server.agent().get("/api/dev/outbox")).body.items;
      if (!items.some((m) => m.to.includes(email))) await new Promise((r) => setTimeout(r, 250));
    }
    const mine = items.find((m) => m.to.includes(email))!;
    expect(mine.subject).toMatch(/Confirm your e-mail/);
    const one = await server.agent().get(`/api/dev/outbox/${mine.id}`);
    expect(one.status).toBe(200);
    expect(one.body.text).toContain("/verify-email?token=");
    expect((await server.agent().get("/api/dev/outbox/no-such-id")).status).toBe(404);
    expect((await server.agent().get("/api/meta")).body).toEqual({ environment: "test", outbox: true });
  });
});
