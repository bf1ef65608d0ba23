import request from "supertest";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/knex";
import { TEST_PASSWORD, type TestServer, signUpFounder, startTestServer, uniqueEmail } from "./support/http";
import { waitForMail } from "./support/mail";
import { startTestWorkers } from "./support/workers";

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer();
  await startTestWorkers();
});

const tokenOf = (link: string) => decodeURIComponent(new URL(link).pathname.split("/").pop()!);

describe("invite → accept → change role → remove", () => {
  it("runs the whole flow through the e-mail the invitee receives", async () => {
    const admin = await signUpFounder(server, { organizationName: "Orchard Row Press" });
    const inviteeEmail = uniqueEmail("invitee");

    const created = await admin.agent.post(`/api/orgs/${admin.orgId}/invitations`).send({ email: inviteeEmail, role: "annotator" });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ email: inviteeEmail, role: "annotator", status: "pending", sendCount: 1 });

    const mail = await waitForMail(inviteeEmail, /invited to Orchard Row Press/);
    expect(mail.text).toContain("annotator");
    const token = tokenOf(mail.link);

    const preview = await request(server.url).get(`/api/invitations/${encodeURIComponent(token)}`);
    expect(preview.status).toBe(200);
    expect(preview.body).toMatchObject({ organizationName: "Orchard Row Press", email: inviteeEmail, role: "annotator", status: "pending", accountExists: false });

    // The invitee signs up through the link: no new organization, already verified, a member.
    const invitee = server.agent();
    const signUp = await invitee.post("/api/auth/sign-up").send({ email: inviteeEmail, password: TEST_PASSWORD, name: "Juno Ferrel", invitationToken: token });
    expect(signUp.status).toBe(201);
    expect(signUp.body.user.emailVerified).toBe(true);
    expect(signUp.body.memberships).toEqual([{ organizationId: admin.orgId, organizationName: "Orchard Row Press", role: "annotator" }]);

    const members = await admin.agent.get(`/api/orgs/${admin.orgId}/members`);
    const inviteeId = signUp.body.user.id as string;
    expect(members.body.items.map((m: { email: string; role: string }) => [m.email, m.role])).toContainEqual([inviteeEmail, "annotator"]);
    const list = await admin.agent.get(`/api/orgs/${admin.orgId}/invitations`);
    expect(list.body.items.find((i: { email: string }) => i.email === inviteeEmail).status).toBe("accepted");

    // The link is single-use.
    const reuse = await server.agent().post("/api/auth/sign-up").send({ email: inviteeEmail, password: TEST_PASSWORD, name: "Again", invitationToken: token });
    expect([409, 410]).toContain(reuse.status);

    // Role change: takes effect at once and rotates the invitee's session on its next request.
    expect((await invitee.get(`/api/orgs/${admin.orgId}/audit`)).status).toBe(403);
    const changed = await admin.agent.patch(`/api/orgs/${admin.orgId}/members/${inviteeId}`).send({ role: "manager" });
    expect(changed.status).toBe(200);
    expect(changed.body.role).toBe("manager");
    const sessionsBefore = (await db("user_session").where({ user_id: inviteeId }).select("id")).map((r) => r.id);
    const afterChange = await invitee.get("/api/me");
    expect(afterChange.status).toBe(200);
    expect(afterChange.body.memberships[0].role).toBe("manager");
    expect(([] as string[]).concat(afterChange.headers["set-cookie"] ?? []).some((c) => c.startsWith("tagloom_session="))).toBe(true);
    const sessionsAfter = (await db("user_session").where({ user_id: inviteeId }).select("id")).map((r) => r.id);
    expect(sessionsAfter.some((id) => sessionsBefore.includes(id))).toBe(false);
    expect((await invitee.get("/api/me")).status).toBe(200);

    // Removal: the member's sessions end at once and the organization answers 404 to them.
    expect((await admin.agent.delete(`/api/orgs/${admin.orgId}/members/${inviteeId}`)).status).toBe(204);
    expect((await invitee.get("/api/me")).status).toBe(401);
    const again = server.agent();
    await again.post("/api/auth/sign-in").send({ email: inviteeEmail, password: TEST_PASSWORD });
    expect((await again.get(`/api/orgs/${admin.orgId}/members`)).status).toBe(404);

    const audit = await admin.agent.get(`/api/orgs/${admin.orgId}/audit`);
    const actions = audit.body.items.map((e: { action: string }) => e.action);
    for (const a of ["invitation.created", "member.joined", "member.role_changed", "member.removed"]) expect(actions).toContain(a);
  });

  it("lets an existing user accept while signed in with the invited address, and refuses another account", async () => {
    const admin = await signUpFounder(server, { organizationName: "Second Lantern Co" });
    const existing = await signUpFounder(server, { organizationName: "Their Own Org" });
    await admin.agent.post(`/api/orgs/${admin.orgId}/invitations`).send({ email: existing.email, role: "data_lead" });
    const token = tokenOf((await waitForMail(existing.email, /invited to Second Lantern Co/)).link);

    const stranger = await signUpFounder(server, { organizationName: "Stranger Org" });
    const wrong = await stranger.agent.post(`/api/invitations/${encodeURIComponent(token)}/accept`);
    expect(wrong.status).toBe(403);
    expect(wrong.body.error.message).toContain(existing.email);

    const ok = await existing.agent.post(`/api/invitations/${encodeURIComponent(token)}/accept`);
    expect(ok.status).toBe(200);
    const me = await existing.agent.get("/api/me");
    expect(me.body.memberships.map((m: { organizationName: string; role: string }) => [m.organizationName, m.role]).sort()).toEqual([
      ["Second Lantern Co", "data_lead"],
      ["Their Own Org", "admin"],
    ]);
  });
});

describe("invitation lifecycle", () => {
  it("refuses a second pending invitation, resends with a new link that replaces the old, and revokes", async () => {
    const admin = await signUpFounder(server);
    const email = uniqueEmail("lifecycle");
    const first = await admin.agent.post(`/api/orgs/${admin.orgId}/invitations`).send({ email, role: "annotator" });
    const oldToken = tokenOf((await waitForMail(email, /invited/)).link);
    const dup = await admin.agent.post(`/api/orgs/${admin.orgId}/invitations`).send({ email, role: "manager" });
    expect(dup.status).toBe(409);
    expect(dup.body.error.code).toBe("invitation_pending");

    const resent = await admin.agent.post(`/api/orgs/${admin.orgId}/invitations/${first.body.id}/resend`);
    expect(resent.status).toBe(200);
    expect(resent.body.sendCount).toBe(2);
    // Wait for the second message (a different link).
    const { testMail } = await import("./support/mail");
    const second = await testMail().waitFor((m) => m.to.includes(email) && !m.text.includes(encodeURIComponent(oldToken)));
    const newToken = tokenOf(/https?:\/\/\S+/.exec(second.text)![0]);
    expect(newToken).not.toBe(oldToken);
    expect((await request(server.url).get(`/api/invitations/${encodeURIComponent(oldToken)}`)).status).toBe(404);

    expect((await admin.agent.delete(`/api/orgs/${admin.orgId}/invitations/${first.body.id}`)).status).toBe(204);
    const preview = await request(server.url).get(`/api/invitations/${encodeURIComponent(newToken)}`);
    expect(preview.body.status).toBe("revoked");
    const use = await server.agent().post("/api/auth/sign-up").send({ email, password: TEST_PASSWORD, name: "Late", invitationToken: newToken });
    expect(use.status).toBe(410);
    expect(use.body.error.code).toBe("invitation_unusable");
    expect(await db("auth_user").where({ email }).first()).toBeUndefined();
  });

  it("refuses an expired invitation and lets the admin send it again", async () => {
    const admin = await signUpFounder(server);
    const email = uniqueEmail("expired");
    const inv = await admin.agent.post(`/api/orgs/${admin.orgId}/invitations`).send({ email, role: "annotator" });
    const token = tokenOf((await waitForMail(email, /invited/)).link);
    await db("invitations").where({ id: inv.body.id }).update({ expires_at: new Date(Date.now() - 60_000) });
    const use = await server.agent().post("/api/auth/sign-up").send({ email, password: TEST_PASSWORD, name: "Late", invitationToken: token });
    expect(use.status).toBe(410);
    expect(use.body.error.details.status).toBe("expired");
    const list = await admin.agent.get(`/api/orgs/${admin.orgId}/invitations`);
    expect(list.body.items[0].status).toBe("expired");
    expect((await admin.agent.post(`/api/orgs/${admin.orgId}/invitations/${inv.body.id}/resend`)).body.status).toBe("pending");
  });

  it("refuses to invite someone who is already a member", async () => {
    const admin = await signUpFounder(server);
    const res = await admin.agent.post(`/api/orgs/${admin.orgId}/invitations`).send({ email: admin.email, role: "annotator" });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe("already_member");
  });
});

describe("last admin", () => {
  it("cannot be demoted or removed; with a second admin both work", async () => {
    const admin = await signUpFounder(server);
    const demote = await admin.agent.patch(`/api/orgs/${admin.orgId}/members/${admin.userId}`).send({ role: "manager" });
    expect(demote.status).toBe(409);
    expect(demote.body.error.code).toBe("last_admin");
    const remove = await admin.agent.delete(`/api/orgs/${admin.orgId}/members/${admin.userId}`);
    expect(remove.status).toBe(409);
    const { addSignedInMember } = await import("./support/http");
    const second = await addSignedInMember(server, admin.orgId, "annotator");
    expect((await admin.agent.patch(`/api/orgs/${admin.orgId}/members/${second.userId}`).send({ role: "admin" })).status).toBe(200);
    expect((await admin.agent.patch(`/api/orgs/${admin.orgId}/members/${admin.userId}`).send({ role: "manager" })).status).toBe(200);
    const roles = (await db("memberships").where({ organization_id: admin.orgId }).select("role")).map((r) => r.role).sort();
    expect(roles).toEqual(["admin", "manager"]);
  });

  it("survives two admins demoting each other at the same moment: one admin remains", async () => {
    const a = await signUpFounder(server);
    const { addSignedInMember } = await import("./support/http");
    const b = await addSignedInMember(server, a.orgId, "admin");
    const [r1, r2] = await Promise.all([
      a.agent.patch(`/api/orgs/${a.orgId}/members/${b.userId}`).send({ role: "annotator" }),
      b.agent.patch(`/api/orgs/${a.orgId}/members/${a.userId}`).send({ role: "annotator" }),
    ]);
    // The loser gets 409 (last admin) when both passed the role check, or 403 when its request
    // arrived after it had already been demoted. Either way exactly one change happens.
    const statuses = [r1.status, r2.status].sort();
    expect(statuses[0]).toBe(200);
    expect([403, 409]).toContain(statuses[1]);
    const admins = await db("memberships").where({ organization_id: a.orgId, role: "admin" }).count({ n: "*" }).first();
    expect(admins).toEqual({ n: 1 });
  });
});

describe("organizations", () => {
  it("a user founds a second organization and switches between them; deleting needs the exact name", async () => {
    const admin = await signUpFounder(server, { organizationName: "First Fold" });
    const created = await admin.agent.post("/api/orgs").send({ name: "Second Fold" });
    expect(created.status).toBe(201);
    const me = await admin.agent.get("/api/me");
    expect(me.body.memberships.map((m: { organizationName: string }) => m.organizationName).sort()).toEqual(["First Fold", "Second Fold"]);
    const wrong = await admin.agent.delete(`/api/orgs/${created.body.id}`).send({ confirmName: "second fold" });
    expect(wrong.status).toBe(400);
    expect((await admin.agent.delete(`/api/orgs/${created.body.id}`).send({ confirmName: "Second Fold" })).status).toBe(204);
    expect(await db("organizations").where({ id: created.body.id }).first()).toBeUndefined();
    expect((await admin.agent.get(`/api/orgs/${created.body.id}`)).status).toBe(404);
  });
});
