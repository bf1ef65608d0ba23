import { db } from "@/db/knex";
import { type SignedIn, type TestServer, addSignedInMember, signUpFounder, uniqueEmail } from "./http";

/**
 * One organization with a member of each role and one object of every kind that tenant routes
 * address by id. Features add their objects here (one field each) so that the cross-tenant and
 * role matrices in tenancy.test.ts reach their routes with real ids.
 */
export type TenantFixture = {
  orgId: string;
  admin: SignedIn;
  manager: SignedIn;
  dataLead: SignedIn;
  annotator: SignedIn;
  /** A member that routes about members act on (an annotator). */
  memberUserId: string;
  invitationId: string;
  /** Extra ids added by features (corpusId, documentId, ...). */
  ids: Record<string, string>;
};

type FixtureExtension = (f: TenantFixture, server: TestServer) => Promise<void>;
const extensions: FixtureExtension[] = [];

/** Features register how to create their objects in a fixture organization. */
export function extendTenantFixture(ext: FixtureExtension): void {
  extensions.push(ext);
}

export async function buildTenantFixture(server: TestServer, organizationName: string): Promise<TenantFixture> {
  const admin = await signUpFounder(server, { organizationName });
  const orgId = admin.orgId;
  const [manager, dataLead, annotator, target] = await Promise.all([
    addSignedInMember(server, orgId, "manager"),
    addSignedInMember(server, orgId, "data_lead"),
    addSignedInMember(server, orgId, "annotator"),
    addSignedInMember(server, orgId, "annotator", "Target Member"),
  ]);
  const inv = await admin.agent.post(`/api/orgs/${orgId}/invitations`).send({ email: uniqueEmail("invitee"), role: "annotator" });
  if (inv.status !== 201) throw new Error(`fixture invitation failed: ${inv.status} ${JSON.stringify(inv.body)}`);
  const f: TenantFixture = { orgId, admin, manager, dataLead, annotator, memberUserId: target.userId, invitationId: inv.body.id, ids: {} };
  for (const ext of extensions) await ext(f, server);
  return f;
}

/**
 * A fingerprint of every row of the organization in every table that has an organization_id
 * column, plus its members' sessions: equal fingerprints mean nothing of it changed.
 */
export async function tenantFingerprint(orgId: string): Promise<Record<string, string>> {
  const tables: { table_name: string }[] = (
    await db.raw(
      `SELECT table_name FROM information_schema.columns
       WHERE table_schema = 'public' AND column_name = 'organization_id' ORDER BY table_name`,
    )
  ).rows;
  const out: Record<string, string> = {};
  for (const { table_name } of tables) {
    const r = await db.raw(`SELECT md5(coalesce(string_agg(t::text, '|' ORDER BY t::text), '')) AS h FROM ?? t WHERE organization_id = ?`, [
      table_name,
      orgId,
    ]);
    out[table_name] = r.rows[0].h;
  }
  const sessions = await db.raw(
    `SELECT md5(coalesce(string_agg(s.id || s.expires_at::text, '|' ORDER BY s.id), '')) AS h
     FROM user_session s JOIN memberships m ON m.user_id = s.user_id WHERE m.organization_id = ?`,
    [orgId],
  );
  out.user_session = sessions.rows[0].h;
  const org = await db.raw(`SELECT md5(coalesce(string_agg(o::text, '|'), '')) AS h FROM organizations o WHERE id = ?`, [orgId]);
  out.organizations = org.rows[0].h;
  return out;
}
