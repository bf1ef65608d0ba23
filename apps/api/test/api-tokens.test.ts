import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/knex";
import { type TestServer, addSignedInMember, signUpFounder, startTestServer } from "./support/http";

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer();
});

describe("organization API tokens", () => {
  it("shows the secret once, keeps only its SHA-256 hash, lists without it and revokes", async () => {
    const admin = await signUpFounder(server, { organizationName: "Fennick Lane Archive" });
    const lead = await addSignedInMember(server, admin.orgId, "data_lead", "Orla Vantree");
    const created = await lead.agent.post(`/api/orgs/${admin.orgId}/tokens`).send({ name: "  nightly pipeline " });
    expect(created.status).toBe(201);
    expect(created.headers["cache-control"]).toBe("no-store");
    const { id, token, prefix, name } = created.body as { id: string; token: string; prefix: string; name: string };
    expect(name).toBe("nightly pipeline");
    expect(token).toMatch(/^tgl_[A-Za-z0-9_-]{43}$/);
    expect(token.startsWith(prefix)).toBe(true);
    expect(prefix).toHaveLength(12);

    // The database keeps the SHA-256 of the secret (common practice for bearer secrets), never the secret.
    const { createHash } = await import("node:crypto");
    const row = await db("api_tokens").where({ id }).first();
    expect(row.token_hash).toBe(createHash("sha256").update(token).digest("hex"));
    expect(JSON.stringify(row)).not.toContain(token);

    const list = await lead.agent.get(`/api/orgs/${admin.orgId}/tokens`);
    expect(list.status).toBe(200);
    expect(list.body.items).toHaveLength(1);
    expect(list.body.items[0]).toMatchObject({ id, name: "nightly pipeline", prefix, lastUsedAt: null, revokedAt: null });
    expect(list.body.items[0].createdBy).toContain("Orla Vantree");
    expect(JSON.stringify(list.body)).not.toContain(token);
    expect(Object.keys(list.body.items[0]).sort()).toEqual(["createdAt", "createdBy", "id", "lastUsedAt", "name", "prefix", "revokedAt"]);

    expect((await lead.agent.delete(`/api/orgs/${admin.orgId}/tokens/${id}`)).status).toBe(204);
    // Revoking again is harmless and keeps the first time.
    const first = (await lead.agent.get(`/api/orgs/${admin.orgId}/tokens`)).body.items[0].revokedAt;
    expect(first).not.toBeNull();
    expect((await lead.agent.delete(`/api/orgs/${admin.orgId}/tokens/${id}`)).status).toBe(204);
    expect((await lead.agent.get(`/api/orgs/${admin.orgId}/tokens`)).body.items[0].revokedAt).toBe(first);

    const audit = await admin.agent.get(`/api/orgs/${admin.orgId}/audit`);
    const actions = audit.body.items.map((e: { action: string }) => e.action);
    expect(actions.filter((a: string) => a === "api_token.created")).toHaveLength(1);
    expect(actions.filter((a: string) => a === "api_token.revoked")).toHaveLength(1);
    expect(JSON.stringify(audit.body)).not.toContain(token);
  });

  it("refuses an empty name and unknown ids, and other roles", async () => {
    const admin = await signUpFounder(server, { organizationName: "Pellwick Ferry Office" });
    const bad = await admin.agent.post(`/api/orgs/${admin.orgId}/tokens`).send({ name: "   " });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.fields.name).toBeDefined();
    expect((await admin.agent.delete(`/api/orgs/${admin.orgId}/tokens/not-an-id`)).status).toBe(404);
    expect((await admin.agent.delete(`/api/orgs/${admin.orgId}/tokens/00000000-0000-4000-8000-000000000000`)).status).toBe(404);
    const manager = await addSignedInMember(server, admin.orgId, "manager");
    expect((await manager.agent.post(`/api/orgs/${admin.orgId}/tokens`).send({ name: "mine" })).status).toBe(403);
    expect((await manager.agent.get(`/api/orgs/${admin.orgId}/tokens`)).status).toBe(403);
    expect(await db("api_tokens").where({ organization_id: admin.orgId }).count({ n: "*" }).first()).toEqual({ n: 0 });
  });
});
