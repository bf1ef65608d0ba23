import type { Actor } from "@/audit/audit.service";
import { hashPassword } from "@/auth/passwords";
import { getUserByEmail } from "@/auth/users.service";
import { insertUser } from "@/auth/users.repository";
import { createBatch } from "@/annotation/batches.service";
import { createCorpus, listEntityTypes } from "@/corpora/corpora.service";
import { createEntityType } from "@/corpora/entity-types.service";
import { db } from "@/db/knex";
import { addMember } from "@/members/members.service";
import { createOrganizationRecord } from "@/orgs/orgs.service";
import { processFileGroup } from "@/uploads/process-files";
import { receiveUpload } from "@/uploads/uploads.service";
import { buildDemoDocuments, demoEntityTypes } from "./demo-corpus";
import { DEMO_ORGANIZATION, DEMO_PASSWORD, demoUsers } from "./demo-data";

/**
 * Loads the demo organization once: its members, a corpus of invented supply agreements with a
 * schema (some documents gold, split into train and test), and a batch for the two annotators.
 * Later runs change nothing.
 */
export async function seedDemoData(): Promise<{ created: boolean; organizationId: string | null }> {
  const first = demoUsers[0]!;
  if (await getUserByEmail(first.email)) return { created: false, organizationId: null };
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const { organizationId, userIds } = await db.transaction(async (trx) => {
    const org = await createOrganizationRecord(DEMO_ORGANIZATION, trx);
    const userIds: Record<string, string> = {};
    for (const u of demoUsers) {
      const user = await insertUser({ email: u.email, name: u.name, passwordHash, emailVerified: true }, trx);
      await addMember(org.id, user.id, u.role, trx);
      userIds[u.email] = user.id;
    }
    return { organizationId: org.id, userIds };
  });

  const manager = demoUsers.find((u) => u.role === "manager")!;
  const actor: Actor & { userId: string; name: string } = { userId: userIds[manager.email]!, email: manager.email, name: manager.name, ip: null };
  const corpus = await createCorpus(organizationId, { name: "Supply agreements", description: "Invented supply agreements, purchase orders and amendments for the demo." }, actor);
  for (const t of demoEntityTypes) await createEntityType(organizationId, corpus.id, t, actor);

  const jsonl = buildDemoDocuments()
    .map((d) => JSON.stringify(d))
    .join("\n");
  const buffer = Buffer.from(`${jsonl}\n`, "utf8");
  const result = await receiveUpload(
    organizationId,
    corpus.id,
    { spanMode: "gold" },
    [{ originalname: "demo-supply-agreements.jsonl", size: buffer.length, buffer, oversized: false }],
    actor,
  );
  // Process the file now (the queued job finds it done) so the batch below can use its documents.
  const queued = result.files.filter((f) => f.state === "queued").map((f) => f.id);
  if (queued.length) await processFileGroup({ organizationId, corpusId: corpus.id, uploadId: result.upload.id, fileIds: queued });

  const fresh = await db("documents").where({ organization_id: organizationId, corpus_id: corpus.id, annotation_status: "none" }).orderBy("source_index").limit(6).pluck("id");
  if ((await listEntityTypes(organizationId, corpus.id)).length && fresh.length) {
    const annotators = demoUsers.filter((u) => u.role === "annotator").map((u) => userIds[u.email]!);
    const due = new Date(Date.now() + 14 * 86_400_000).toISOString().slice(0, 10);
    await createBatch(
      organizationId,
      corpus.id,
      { name: "First review round", dueDate: due, documentIds: fresh, assignment: { mode: "round_robin", annotatorIds: annotators, annotatorsPerDocument: 2 } },
      actor,
    );
  }
  return { created: true, organizationId };
}
