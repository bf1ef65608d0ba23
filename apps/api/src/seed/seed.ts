import { waitFor } from "./demo-wait";
import { createRng } from "@tagloom/tagger";
import type { Actor } from "@/audit/audit.service";
import { hashPassword } from "@/auth/passwords";
import { getUserByEmail } from "@/auth/users.service";
import { insertUser } from "@/auth/users.repository";
import { saveAssignment, submitAssignment } from "@/annotation/assignments.service";
import { createBatch } from "@/annotation/batches.service";
import { settleDocument } from "@/annotation/review.service";
import { createCorpus } from "@/corpora/corpora.service";
import { createEntityType } from "@/corpora/entity-types.service";
import { db } from "@/db/knex";
import { createInvitation } from "@/invitations/invitations.service";
import { addMember } from "@/members/members.service";
import { createOrganizationRecord } from "@/orgs/orgs.service";
import type { ReceivedFile } from "@/uploads/upload-storage";
import { receiveUpload } from "@/uploads/uploads.service";
import { simulateAnnotator } from "./demo-annotators";
import { seedBilling } from "./demo-billing";
import { buildDemoDocuments, demoEntityTypes, type DemoDocument, type DemoSpan } from "./demo-corpus";
import { DEMO_ORGANIZATION, DEMO_PASSWORD, DEMO_PENDING_INVITEE, demoUsers } from "./demo-data";
import { buildDemoDocx, buildDemoPdf } from "./demo-files";
import { seedTaggers } from "./demo-taggers";
import { seedApiToken } from "./demo-token";

type Person = Actor & { userId: string; name: string };
type DemoContext = { organizationId: string; corpusId: string; people: Record<string, Person>; docs: DemoDocument[]; idsByTitle: Map<string, string> };

const DAY = 86_400_000;
const isoDay = (offsetDays: number) => new Date(Date.now() + offsetDays * DAY).toISOString().slice(0, 10);

export type SeedResult =
  | { created: false; organizationId: null }
  | { created: true; organizationId: string; corpusId: string; suggesterId: string; apiToken: string };

/**
 * Loads the demo organization once: seven members in four roles, a corpus of 400 invented supply
 * documents (a quarter gold with a test split, some uploaded as generated PDF and Word files), a
 * batch under review with two annotators' disagreements and a batch in progress, eight paid seats
 * with a paid invoice (the eighth held by a pending invitation), two trained taggers (the better one the suggester, its suggestions on the
 * open documents) and an API token whose secret is returned once. Later runs change nothing.
 *
 * It needs the product running beside it: the payments fake and the API (for the payments
 * webhooks) and a worker (for the training and suggestion jobs), as `npm start` arranges.
 */
export async function seedDemoData(): Promise<SeedResult> {
  const first = demoUsers[0]!;
  if (await getUserByEmail(first.email)) return { created: false, organizationId: null };
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const { organizationId, people } = await db.transaction(async (trx) => {
    const org = await createOrganizationRecord(DEMO_ORGANIZATION, trx);
    const people: Record<string, Person> = {};
    for (const u of demoUsers) {
      const user = await insertUser({ email: u.email, name: u.name, passwordHash, emailVerified: true }, trx);
      await addMember(org.id, user.id, u.role, trx);
      people[u.email.split("@")[0]!] = { userId: user.id, email: u.email, name: u.name, ip: null };
    }
    return { organizationId: org.id, people };
  });
  const ctx = await seedCorpus(organizationId, people);
  await seedReviewBatch(ctx);
  await seedBatchInProgress(ctx);
  await seedBilling(organizationId, people.admin!);
  // One invitation waits for an answer: its e-mail goes through the real mail path to the Outbox
  // (beside the batches' assignment notices) and it holds the last paid seat.
  await createInvitation(organizationId, { email: DEMO_PENDING_INVITEE, role: "annotator" }, people.admin!);
  const { suggesterId } = await seedTaggers(organizationId, ctx.corpusId, people.lead!);
  const apiToken = await seedApiToken(organizationId, people.admin!);
  return { created: true, organizationId, corpusId: ctx.corpusId, suggesterId, apiToken };
}

async function seedCorpus(organizationId: string, people: Record<string, Person>): Promise<DemoContext> {
  const manager = people.manager!;
  const corpus = await createCorpus(
    organizationId,
    { name: "Supply agreements", description: "Invented supply agreements, purchase orders, amendments and delivery notes for the demo." },
    manager,
  );
  for (const t of demoEntityTypes) await createEntityType(organizationId, corpus.id, t, manager);

  const docs = buildDemoDocuments();
  const lines = docs
    .filter((d) => d.format === "jsonl")
    .map((d) => JSON.stringify(d.gold ? { title: d.title, text: d.text, split: d.split, spans: d.spans } : { title: d.title, text: d.text }));
  const jsonl = Buffer.from(`${lines.join("\n")}\n`, "utf8");
  const files: ReceivedFile[] = [{ originalname: "supply-desk-archive.jsonl", size: jsonl.length, buffer: jsonl, oversized: false }];
  for (const d of docs) {
    if (d.format === "jsonl") continue;
    const name = d.title.replace(/[^A-Za-z0-9]+/g, "-").replace(/^-|-$/g, "").toLowerCase();
    const buffer = d.format === "pdf" ? buildDemoPdf(d.title, d.text) : await buildDemoDocx(d.title, d.text);
    files.push({ originalname: `${name}.${d.format}`, size: buffer.length, buffer, oversized: false });
  }
  const result = await receiveUpload(organizationId, corpus.id, { spanMode: "gold" }, files, manager);
  // The running workers read the files (the demo loads beside the running product); reading them
  // here as well would race the worker for the same files. Wait until every file is read.
  await waitFor(
    "the demo files to be read",
    async () => {
      const open = await db("upload_files").where({ organization_id: organizationId, upload_id: result.upload.id }).whereIn("state", ["queued", "processing"]).count({ n: "*" }).first();
      return Number(open?.n ?? 0) === 0 ? true : null;
    },
    120_000,
  );

  const rows: { id: string; title: string }[] = await db("documents").where({ organization_id: organizationId, corpus_id: corpus.id }).select("id", "title");
  const idsByTitle = new Map(rows.map((r) => [r.title, r.id]));
  return { organizationId, corpusId: corpus.id, people, docs, idsByTitle };
}

/** Open JSONL documents (their answer key is known), in corpus order. */
function openDocuments(ctx: DemoContext, skip: number, count: number): { doc: DemoDocument; id: string }[] {
  return ctx.docs
    .filter((d) => !d.gold && d.format === "jsonl" && d.text.length < 4000)
    .slice(skip, skip + count)
    .map((doc) => ({ doc, id: ctx.idsByTitle.get(doc.title)! }));
}

async function assignmentsOf(ctx: DemoContext, batchId: string): Promise<{ id: string; documentId: string; annotatorId: string }[]> {
  return db("assignments")
    .where({ organization_id: ctx.organizationId, batch_id: batchId })
    .orderBy(["document_id", "annotator_id"])
    .select({ id: "id", documentId: "document_id", annotatorId: "annotator_id" });
}

function sameSpans(a: readonly DemoSpan[], b: readonly DemoSpan[]): boolean {
  return a.length === b.length && a.every((s, i) => s.start === b[i]!.start && s.end === b[i]!.end && s.type === b[i]!.type);
}

/**
 * Two annotators marked the same ten documents and submitted: four have been settled into gold,
 * six wait for the manager with the annotators' disagreements.
 */
async function seedReviewBatch(ctx: DemoContext): Promise<void> {
  const { people } = ctx;
  const picked = openDocuments(ctx, 0, 10);
  const batch = await createBatch(
    ctx.organizationId,
    ctx.corpusId,
    {
      name: "Second look: spring orders",
      dueDate: isoDay(3),
      documentIds: picked.map((p) => p.id),
      assignment: { mode: "round_robin", annotatorIds: [people.annotator1!.userId, people.annotator2!.userId], annotatorsPerDocument: 2 },
    },
    people.manager!,
  );
  const rng = createRng(7);
  const assignments = await assignmentsOf(ctx, batch.id);
  // In the picked documents' order, the first annotator first: document ids are random, so
  // their order would hand the simulated annotators' random draws to different documents each run.
  for (const [index, p] of picked.entries()) {
    const marked = [people.annotator1!, people.annotator2!].map((who) => {
      const a = assignments.find((x) => x.documentId === p.id && x.annotatorId === who.userId)!;
      return { a, who, spans: simulateAnnotator(p.doc.text, p.doc.spans, who === people.annotator1 ? "careful" : "hasty", rng) };
    });
    // Every document left for review (all but the four settled below) shows at least one
    // disagreement: where the two happened to agree, the hasty one missed the last span.
    const [careful, hasty] = marked as [(typeof marked)[number], (typeof marked)[number]];
    if (index >= 4 && hasty.spans.length > 0 && sameSpans(careful.spans, hasty.spans)) hasty.spans = hasty.spans.slice(0, -1);
    for (const { a, who, spans } of marked) {
      const member = { organizationId: ctx.organizationId, userId: who.userId, role: "annotator" as const };
      const saved = await saveAssignment(member, ctx.corpusId, a.id, { version: 0, spans: spans.map((s) => ({ ...s, origin: "human" as const })), dismissedSuggestions: [] });
      await submitAssignment(member, ctx.corpusId, a.id, saved.version, who);
    }
  }
  for (const p of picked.slice(0, 4)) {
    await settleDocument(ctx.organizationId, ctx.corpusId, batch.id, p.id, p.doc.spans, people.manager!);
  }
}

/** Two more annotators have a dozen documents each; some started, none submitted yet. */
async function seedBatchInProgress(ctx: DemoContext): Promise<void> {
  const { people } = ctx;
  const picked = openDocuments(ctx, 10, 24);
  const batch = await createBatch(
    ctx.organizationId,
    ctx.corpusId,
    {
      name: "Third round: delivery notes and orders",
      dueDate: isoDay(10),
      documentIds: picked.map((p) => p.id),
      assignment: { mode: "round_robin", annotatorIds: [people.annotator3!.userId, people.annotator4!.userId], annotatorsPerDocument: 1 },
    },
    people.manager!,
  );
  const rng = createRng(11);
  let n = 0;
  for (const a of await assignmentsOf(ctx, batch.id)) {
    if (n++ % 3 !== 0) continue;
    const { doc } = picked.find((p) => p.id === a.documentId)!;
    const who = a.annotatorId === people.annotator3!.userId ? people.annotator3! : people.annotator4!;
    const spans = simulateAnnotator(doc.text, doc.spans, "careful", rng, 0.5);
    const member = { organizationId: ctx.organizationId, userId: who.userId, role: "annotator" as const };
    await saveAssignment(member, ctx.corpusId, a.id, { version: 0, spans: spans.map((s) => ({ ...s, origin: "human" as const })), dismissedSuggestions: [] });
  }
}
