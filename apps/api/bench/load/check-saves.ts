import type { Knex } from "knex";
import type { AnnotatorLog } from "./annotators";

export type SaveCheck = {
  acknowledged: number;
  lost: number;
  /** Versions the database is ahead of the acknowledged saves by more than unanswered saves explain. */
  unexplainedVersions: number;
  firstProblem: string | null;
};

type SpanLike = { start: number; end: number };
const key = (spans: Array<SpanLike & { typeId: string }>) => spans.map((s) => `${s.start}:${s.end}:${s.typeId}`).join(",");

/**
 * Reads every assignment straight from PostgreSQL and checks that each save the API acknowledged
 * is there. A save's row is overwritten by the annotator's next save, so an acknowledged save is
 * present when either it is what the row holds now, or a later save of the same annotator, sent
 * from the version this one returned, replaced it (the versions the API returned form a chain
 * without repeats). It is lost when:
 * - the row's version is below the version its answer returned (the write was not kept);
 * - two answers returned the same version (one of the two saves was overwritten unseen);
 * - the row holds the last acknowledged version but other spans than that save sent;
 * - the row is ahead of the last acknowledged save and holds spans no unanswered save sent.
 */
export async function checkAcknowledgedSaves(db: Knex, logs: AnnotatorLog[], typeIds: Record<string, string>): Promise<SaveCheck> {
  const rows = await db("assignments")
    .whereIn("id", logs.map((l) => l.annotator.assignmentId))
    .select<Array<{ id: string; version: number; spans: Array<SpanLike & { typeId: string }> }>>("id", "version", "spans");
  const byId = new Map(rows.map((r) => [r.id, r]));
  const stored = (spans: Array<SpanLike & { type: string }>) => [...spans].sort((a, b) => a.start - b.start || a.end - b.end).map((s) => ({ start: s.start, end: s.end, typeId: typeIds[s.type]! }));
  const result: SaveCheck = { acknowledged: 0, lost: 0, unexplainedVersions: 0, firstProblem: null };
  const problem = (lost: number, text: string) => {
    result.lost += lost;
    result.firstProblem ??= text;
  };
  for (const log of logs) {
    const row = byId.get(log.annotator.assignmentId);
    result.acknowledged += log.acks.length;
    if (!log.acks.length) continue;
    if (!row) {
      problem(log.acks.length, `assignment ${log.annotator.assignmentId} is missing`);
      continue;
    }
    const versions = new Set<number>();
    for (const ack of log.acks) {
      if (versions.has(ack.version)) problem(1, `assignment ${row.id}: version ${ack.version} was acknowledged twice`);
      versions.add(ack.version);
    }
    const above = log.acks.filter((a) => a.version > row.version).length;
    if (above) problem(above, `assignment ${row.id}: the row is at version ${row.version}, below ${above} acknowledged save(s)`);
    const last = log.acks[log.acks.length - 1]!;
    const now = key(row.spans);
    if (row.version === last.version && now !== key(stored(last.spans))) {
      problem(1, `assignment ${row.id}: version ${row.version} holds other spans than its acknowledged save sent`);
    } else if (row.version > last.version && !log.unanswered.some((s) => key(stored(s)) === now)) {
      problem(1, `assignment ${row.id}: the row (version ${row.version}) is past the last acknowledged save (${last.version}) and holds spans no save of this annotator sent`);
    }
    // Every version step not acknowledged must be an unanswered save that landed.
    const steps = row.version - log.annotator.openedVersion;
    const explained = versions.size + log.unanswered.length;
    if (steps > explained) result.unexplainedVersions += steps - explained;
  }
  return result;
}
