import type { SetSuggesterInput, SuggesterStatus, UncertainDocument, UncertainQuery, UncertainRanking } from "@tagloom/contracts";
import { type Actor, recordAudit } from "@/audit/audit.service";
import { getCorpus, listEntityTypes, lockWritableCorpus } from "@/corpora/corpora.service";
import { db } from "@/db/knex";
import { iso } from "@/db/types";
import { ConflictError } from "@/errors";
import { enqueueJob } from "@/jobs/boss";
import { logger } from "@/logger";
import { tagAndScore } from "@/tagging/tag-text";
import { type SuggesterTagger, findCorpusTagger, listCorpusTaggers, loadTaggerModel } from "@/tagging/tagger-source";
import {
  type Decision,
  type ShardResult,
  addRunProgress,
  countDecisions,
  deleteTaggerSuggestions,
  findSuggester,
  findTaggerSuggestions,
  insertRun,
  isCurrentSuggester,
  listDocumentIdsWithoutGold,
  listMostUncertain,
  listRecentRuns,
  loadShardDocuments,
  updateSuggester,
  upsertDecisions,
  writeShardResults,
} from "./suggestions.repository";

export const SUGGEST_QUEUE = "suggestions.tag-shard";
/** Documents per shard job: small enough that several workers share a corpus, big enough to amortise loading. */
export const SHARD_DOCUMENTS = 200;

export type SuggestShardData = { organizationId: string; corpusId: string; taggerId: string; runId: string; documentIds: string[] };

function shards(ids: string[], size = SHARD_DOCUMENTS): string[][] {
  const out: string[][] = [];
  for (let i = 0; i < ids.length; i += size) out.push(ids.slice(i, i + size));
  return out;
}

async function enqueueShards(base: Omit<SuggestShardData, "documentIds">, ids: string[]): Promise<void> {
  for (const documentIds of shards(ids)) await enqueueJob(SUGGEST_QUEUE, { ...base, documentIds });
}

/** The corpus's suggester, the latest suggestion runs and the annotators' judgement of it. */
export async function getSuggesterStatus(organizationId: string, corpusId: string): Promise<SuggesterStatus> {
  await getCorpus(organizationId, corpusId);
  const row = (await findSuggester(organizationId, corpusId))!;
  const tagger = row.taggerId ? await findCorpusTagger(organizationId, corpusId, row.taggerId) : null;
  const runs = row.taggerId ? await listRecentRuns(organizationId, corpusId) : [];
  const counts = row.taggerId ? await countDecisions(organizationId, corpusId, row.taggerId) : { accepted: 0, rejected: 0 };
  const judged = counts.accepted + counts.rejected;
  return {
    tagger: tagger ? { id: tagger.id, version: tagger.version, name: tagger.name } : null,
    candidates: await listCorpusTaggers(organizationId, corpusId),
    changedAt: iso(row.changedAt),
    runs: runs.filter((r) => r.taggerId === row.taggerId),
    judgement: { ...counts, precision: judged === 0 ? null : counts.accepted / judged },
  };
}

/**
 * Picks the corpus's suggester (or none). The tagger's earlier suggestions are removed at once
 * (suggestions from imports, and every span a person made, accepted or dismissed in an assignment
 * are elsewhere and stay), and a run tags every document without gold in shards. Choosing the
 * current suggester again changes nothing. Audited.
 */
export async function setSuggester(organizationId: string, corpusId: string, input: SetSuggesterInput, actor: Actor): Promise<SuggesterStatus> {
  const queued = await db.transaction(async (trx) => {
    const corpus = await lockWritableCorpus(organizationId, corpusId, trx);
    const current = (await findSuggester(organizationId, corpusId, trx))!;
    if (current.taggerId === input.taggerId) return null;
    let tagger: SuggesterTagger | null = null;
    if (input.taggerId) {
      tagger = await findCorpusTagger(organizationId, corpusId, input.taggerId, trx);
      if (!tagger) throw new ConflictError("That tagger does not belong to this corpus (or is not finished); pick one of its trained taggers.", { fields: { taggerId: ["Not a tagger of this corpus."] } }, "tagger_unusable");
    }
    const removed = await deleteTaggerSuggestions(organizationId, corpusId, trx);
    let runId: string | null = null;
    let ids: string[] = [];
    if (tagger) {
      ids = await listDocumentIdsWithoutGold(organizationId, corpusId, trx);
      runId = await insertRun(
        { organizationId, corpusId, taggerId: tagger.id, reason: "suggester_changed", shardsTotal: shards(ids).length, documentsTotal: ids.length, createdBy: actor.userId },
        trx,
      );
    }
    await updateSuggester(organizationId, corpusId, tagger?.id ?? null, runId, trx);
    await recordAudit(trx, actor, organizationId, "corpus.suggester_changed", { type: "corpus", id: corpusId, label: corpus.name }, {
      from: current.taggerId,
      to: tagger?.id ?? null,
      toVersion: tagger?.version ?? null,
      removedSuggestions: removed,
      documents: ids.length,
    });
    return tagger && runId ? { taggerId: tagger.id, runId, ids } : null;
  });
  suggesterCache.delete(`${organizationId}:${corpusId}`);
  if (queued) await enqueueShards({ organizationId, corpusId, taggerId: queued.taggerId, runId: queued.runId }, queued.ids);
  return getSuggesterStatus(organizationId, corpusId);
}

/** Called after an upload stored the documents of some files: the suggester (if any) tags those without gold. */
export async function suggestForUploadedFiles(organizationId: string, corpusId: string, fileIds: string[]): Promise<void> {
  if (fileIds.length === 0) return;
  const row = await findSuggester(organizationId, corpusId);
  if (!row?.taggerId) return;
  const ids = await listDocumentIdsWithoutGold(organizationId, corpusId, db, fileIds);
  if (ids.length === 0) return;
  const runId = await insertRun(
    { organizationId, corpusId, taggerId: row.taggerId, reason: "new_documents", shardsTotal: shards(ids).length, documentsTotal: ids.length, createdBy: null },
    db,
  );
  await enqueueShards({ organizationId, corpusId, taggerId: row.taggerId, runId }, ids);
}

/**
 * One shard: tags its documents with the run's tagger and stores suggestions (confidence = the
 * chunk's posterior marginal) and uncertainty. A shard of a suggester that was replaced meanwhile
 * writes nothing; documents that reached gold meanwhile are skipped. Safe to retry.
 */
export async function runSuggestionShard(data: SuggestShardData): Promise<void> {
  const { organizationId, corpusId, taggerId, runId, documentIds } = data;
  const row = await findSuggester(organizationId, corpusId);
  if (row?.taggerId !== taggerId) return;
  const model = await loadTaggerModel(organizationId, corpusId, taggerId);
  const types = new Map((await listEntityTypes(organizationId, corpusId)).map((t) => [t.name, t.id]));
  const docs = await loadShardDocuments(organizationId, documentIds);
  const results: ShardResult[] = docs.map((d) => {
    const { spans, uncertainty } = tagAndScore(model, d.text, d);
    const known = spans.filter((s) => types.has(s.type));
    return {
      documentId: d.id,
      spans: known.map((s) => ({ start: s.start, end: s.end, typeId: types.get(s.type)!, confidence: s.confidence })),
      meanEntropy: uncertainty.meanEntropy,
      leastConfidence: uncertainty.leastConfidence,
      spanConfidences: known.map((s) => s.confidence),
    };
  });
  await db.transaction(async (trx) => {
    if (!(await isCurrentSuggester(organizationId, corpusId, taggerId, trx))) return;
    const spans = await writeShardResults(organizationId, corpusId, taggerId, results, trx);
    await addRunProgress(runId, docs.length, spans, trx);
  });
  logger.debug({ runId, documents: docs.length }, "suggestion shard done");
}

function reasonOf(low: number, total: number, threshold: number): string {
  const pct = Math.round(threshold * 100);
  if (total === 0) return "no entities suggested; the tagger is unsure about plain words";
  return `low-confidence spans: ${low} of ${total} (under ${pct}%)`;
}

/** Documents without gold, most uncertain first under the suggester (mean token entropy). */
export async function getUncertainRanking(organizationId: string, corpusId: string, query: UncertainQuery): Promise<UncertainRanking> {
  await getCorpus(organizationId, corpusId);
  const row = (await findSuggester(organizationId, corpusId))!;
  if (!row.taggerId) throw new ConflictError("This corpus has no suggester yet: a data lead picks one of its taggers first.", null, "no_suggester");
  const tagger = await findCorpusTagger(organizationId, corpusId, row.taggerId);
  if (!tagger) throw new ConflictError("The corpus's suggester is no longer available; pick another tagger.", null, "no_suggester");
  const { rows, considered } = await listMostUncertain(organizationId, corpusId, row.taggerId, query.limit);
  const items: UncertainDocument[] = rows.map((r) => {
    const low = r.spanConfidences.filter((c) => c < query.threshold).length;
    return {
      id: r.documentId,
      title: r.title,
      tokenCount: r.tokenCount,
      score: r.meanEntropy,
      leastConfidence: r.leastConfidence,
      lowConfidenceSpans: low,
      spans: r.spanConfidences.length,
      reason: reasonOf(low, r.spanConfidences.length, query.threshold),
    };
  });
  return { tagger: { id: tagger.id, version: tagger.version }, measure: "mean_token_entropy", threshold: query.threshold, considered, items };
}

const spanKey = (s: { start: number; end: number; typeId: string }) => `${s.start}:${s.end}:${s.typeId}`;

/**
 * After an autosave: which tagger suggestions the annotator accepted (a span kept with origin
 * "suggested" at the suggestion's offsets and type) or dismissed, for the suggester's precision.
 */
export async function recordSuggestionDecisions(
  a: { organizationId: string; corpusId: string; documentId: string; assignmentId: string; userId: string },
  saved: { accepted: Array<{ start: number; end: number; typeId: string }>; dismissed: Array<{ start: number; end: number; typeId: string }> },
): Promise<void> {
  if (saved.accepted.length === 0 && saved.dismissed.length === 0) return;
  const suggestions = await findTaggerSuggestions(a.organizationId, a.documentId);
  if (!suggestions) return;
  const byKey = new Map(suggestions.spans.map((s) => [spanKey(s), s]));
  const decisions: Decision[] = [];
  for (const [list, decision] of [[saved.accepted, "accepted"], [saved.dismissed, "rejected"]] as const) {
    for (const s of list) {
      const hit = byKey.get(spanKey(s));
      if (hit) decisions.push({ start: hit.start, end: hit.end, typeId: hit.typeId, confidence: hit.confidence, decision });
    }
  }
  await upsertDecisions({ ...a, taggerId: suggestions.taggerId }, decisions);
}

/** The corpus's suggester tagger id (null: none chosen), or null when the organization has no such corpus. */
export async function getCorpusSuggester(organizationId: string, corpusId: string): Promise<{ taggerId: string | null } | null> {
  const row = await findSuggester(organizationId, corpusId);
  return row ? { taggerId: row.taggerId } : null;
}

// The tagging API asks for the suggester on every request; remembering it for a moment spares a
// busy pipeline that query. A change made through this process is seen at once (setSuggester
// forgets the entry), one made through another API process within SUGGESTER_CACHE_MS.
const SUGGESTER_CACHE_MS = 1000;
const suggesterCache = new Map<string, { value: { taggerId: string | null } | null; until: number }>();

/** getCorpusSuggester, remembered per organization and corpus for SUGGESTER_CACHE_MS. */
export async function getCorpusSuggesterForTagging(organizationId: string, corpusId: string): Promise<{ taggerId: string | null } | null> {
  const key = `${organizationId}:${corpusId}`;
  const now = Date.now();
  const hit = suggesterCache.get(key);
  if (hit && hit.until > now) return hit.value;
  const value = await getCorpusSuggester(organizationId, corpusId);
  if (suggesterCache.size >= 10_000) suggesterCache.clear();
  suggesterCache.set(key, { value, until: now + SUGGESTER_CACHE_MS });
  return value;
}
