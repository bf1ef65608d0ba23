import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { authenticateApiToken } from "@/api-tokens/api-tokens.service";
import { getBillingState } from "@/billing/billing.service";
import { db } from "@/db/knex";
import { getSuggesterStatus } from "@/suggestions/suggestions.service";
import { type TestServer, startTestServer } from "../../test/support/http";
import { testPayments } from "../../test/support/payments";
import { startTestWorkers, stopTestWorkers } from "../../test/support/workers";
import { insertUser } from "@/auth/users.repository";
import { addMember } from "@/members/members.service";
import { createOrganizationRecord } from "@/orgs/orgs.service";
import { DEMO_SEATS } from "./demo-billing";
import { DEMO_ORGANIZATION } from "./demo-data";
import { dropDemoOrganization } from "./demo-reset";
import { buildDemoDocuments } from "./demo-corpus";
import { seedDemoData } from "./seed";

// The product's default free plan, so the seed has to buy seats for its seven members.
vi.hoisted(() => {
  // eslint-disable-next-line no-restricted-properties -- set before config/env.ts reads it, as test/billing.test.ts does
  process.env.BILLING_FREE_SEATS = "5";
});

// The seed runs beside the product as npm start arranges it: an API for the payments webhooks and
// the job workers for training and suggestions.
let server: TestServer;
beforeAll(async () => {
  server = await startTestServer();
  testPayments(server);
  await startTestWorkers();
});
afterAll(async () => {
  await stopTestWorkers();
});

describe("demo data", () => {
  it("builds the same documents every time, with spans that cover whole names", () => {
    const docs = buildDemoDocuments();
    expect(docs).toHaveLength(400);
    expect(docs.filter((d) => d.gold)).toHaveLength(100);
    expect(docs.filter((d) => d.split === "test")).toHaveLength(25);
    expect(docs.filter((d) => d.format === "pdf")).toHaveLength(16);
    expect(docs.filter((d) => d.format === "docx")).toHaveLength(16);
    for (const d of docs) {
      for (const s of d.spans) {
        const covered = d.text.slice(s.start, s.end);
        expect(covered).toBe(covered.trim());
        expect(covered.length).toBeGreaterThan(1);
      }
    }
    const lengths = docs.map((d) => d.text.length);
    expect(Math.min(...lengths)).toBeLessThan(400);
    expect(Math.max(...lengths)).toBeGreaterThan(6000);
    expect(buildDemoDocuments()).toEqual(docs);
  });

  it("loads the organization, corpus, generated files, gold, two batches, seats, taggers and a token once", async () => {
    const first = await seedDemoData();
    if (!first.created) throw new Error("expected a first load");
    const orgId = first.organizationId;
    expect(await db("memberships").where({ organization_id: orgId }).count({ n: "*" }).first()).toEqual({ n: 7 });
    const docs = await db("documents").where({ organization_id: orgId }).select("annotation_status", "split");
    expect(docs).toHaveLength(400);
    // 100 imported as gold, 4 settled in review.
    expect(docs.filter((d) => d.annotation_status === "gold")).toHaveLength(104);
    expect(docs.filter((d) => d.annotation_status === "submitted")).toHaveLength(6);
    expect(docs.filter((d) => d.split === "test")).toHaveLength(25);
    const files = await db("upload_files").where({ organization_id: orgId }).select("format", "state");
    expect(files.filter((f) => f.state === "ready")).toHaveLength(33);
    const states = await db("assignments").where({ organization_id: orgId }).select("state");
    expect(states).toHaveLength(20 + 24);
    expect(states.filter((s) => s.state === "accepted")).toHaveLength(8);
    expect(states.filter((s) => s.state === "submitted")).toHaveLength(12);
    expect(states.filter((s) => s.state === "in_progress")).toHaveLength(8);
    // Each of the six documents waiting for review shows the manager at least one disagreement.
    const waiting = await db("assignments").where({ organization_id: orgId, state: "submitted" }).select("document_id", "spans");
    const byDocument = new Map<string, string[]>();
    for (const a of waiting) byDocument.set(a.document_id, [...(byDocument.get(a.document_id) ?? []), JSON.stringify(a.spans)]);
    expect([...byDocument.values()].map((versions) => versions.length === 2 && versions[0] !== versions[1])).toEqual([true, true, true, true, true, true]);

    // Seats bought through checkout on the payments fake, its webhooks received by the API.
    const billing = await getBillingState(orgId);
    expect(billing).toMatchObject({ plan: "per_seat", seatLimit: DEMO_SEATS, seatsUsed: 8, paymentFailed: false });
    // The pending invitation holds the eighth seat; its e-mail and the assignment notices were queued for the real mail path.
    expect(await db("invitations").where({ organization_id: orgId }).pluck("email")).toEqual(["fennick.orlavie@demo.tagloom.test"]);
    const kinds = await db("outbound_emails").where({ organization_id: orgId }).pluck("kind");
    expect(kinds.filter((k) => k === "invitation")).toHaveLength(1);
    expect(kinds.filter((k) => k === "batch_assigned")).toHaveLength(4);
    expect(billing.invoices.filter((i) => i.status === "paid")).toHaveLength(1);
    expect(billing.invoices[0]!.amountPaid).toBeGreaterThan(0);
    const webhooks = await db("billing_webhook_events").where({ organization_id: orgId }).pluck("type");
    expect(webhooks).toEqual(expect.arrayContaining(["checkout.session.completed", "invoice.paid"]));

    // Two finished runs with different settings; the suggester is the one with the higher test F1.
    const runs = await db("training_runs as r").join("taggers as t", "t.run_id", "r.id").where("r.organization_id", orgId).orderBy("r.number").select("r.status", "r.config", "t.id", "t.evaluation");
    expect(runs.map((r) => r.status)).toEqual(["succeeded", "succeeded"]);
    expect(runs[0].config).not.toEqual(runs[1].config);
    const f1s = runs.map((r) => r.evaluation.overall.f1 as number);
    const status = await getSuggesterStatus(orgId, first.corpusId);
    expect(status.tagger?.id).toBe(runs[f1s[0]! >= f1s[1]! ? 0 : 1].id);
    expect(status.tagger?.id).toBe(first.suggesterId);
    // Every document without gold was tagged, and spans were suggested.
    const withoutGold = docs.filter((d) => d.annotation_status !== "gold").length;
    expect(status.runs[0]).toMatchObject({ documentsTotal: withoutGold, documentsDone: withoutGold });
    expect(status.runs[0]!.spansSuggested).toBeGreaterThan(0);

    // The token's secret authenticates as the demo organization.
    const identity = await authenticateApiToken(first.apiToken);
    expect(typeof identity === "object" && identity.organizationId).toBe(orgId);

    const again = await seedDemoData();
    expect(again.created).toBe(false);
    expect(await db("documents").where({ organization_id: orgId }).count({ n: "*" }).first()).toEqual({ n: 400 });
  }, 300_000);

  it("demo reset drops the demo organization and its users only, and the demo loads again", async () => {
    const other = await db.transaction(async (trx) => {
      const org = await createOrganizationRecord(DEMO_ORGANIZATION, trx);
      const user = await insertUser({ email: "someone@elsewhere.test", name: "Ulvra Penmoss", passwordHash: "x", emailVerified: true }, trx);
      await addMember(org.id, user.id, "admin", trx);
      return org;
    });
    expect(await dropDemoOrganization()).toBe(1);
    // Another organization that happens to have the demo's name stays, with its member and data.
    expect(await db("organizations").pluck("id")).toEqual([other.id]);
    expect(await db("auth_user").pluck("email")).toEqual(["someone@elsewhere.test"]);
    expect(await db("documents").count({ n: "*" }).first()).toEqual({ n: 0 });
    const again = await seedDemoData();
    expect(again.created).toBe(true);
    expect(await db("organizations").count({ n: "*" }).first()).toEqual({ n: 2 });
  }, 300_000);
});
