import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { type SignedIn, type TestServer, addSignedInMember, signUpFounder, startTestServer } from "./support/http";

// Answers meant for one signed-in person must not be kept by a browser or a shared cache (a proxy
// or a shared computer would otherwise hand them to the next person): common practice, RFC 9111
// section 5.2.2.5 ("no-store").
let server: TestServer;
let admin: SignedIn;
let annotator: SignedIn;

beforeAll(async () => {
  server = await startTestServer();
  admin = await signUpFounder(server, { organizationName: "Cache Check Guild" });
  annotator = await addSignedInMember(server, admin.orgId, "annotator", "Ilsa Fenwary");
}, 60_000);
afterAll(() => server.close());

describe("Cache-Control on authenticated JSON answers", () => {
  it("is no-store on reads, writes, refusals and errors", async () => {
    const o = `/api/orgs/${admin.orgId}`;
    const answers = [
      await admin.agent.get("/api/me"),
      await admin.agent.get(o),
      await admin.agent.get(`${o}/members`),
      await admin.agent.get(`${o}/corpora`),
      await admin.agent.get(`${o}/audit`),
      await admin.agent.post(`${o}/corpora`).send({ name: "Harbour notes" }),
      await admin.agent.post(`${o}/corpora`).send({ name: 42 }),
      await admin.agent.get(`${o}/corpora/00000000-0000-4000-8000-000000000000`),
      await annotator.agent.get(`${o}/audit`),
      await annotator.agent.get(`${o}/queue`),
      await admin.agent.get("/api/no-such-route"),
    ];
    expect(answers.map((r) => r.status)).toEqual([200, 200, 200, 200, 200, 201, 400, 404, 403, 200, 404]);
    answers.forEach((r, i) => {
      expect(r.headers["content-type"], `answer ${i}`).toMatch(/^application\/json/);
      expect(r.headers["cache-control"], `answer ${i}`).toBe("no-store");
    });
  });
});
