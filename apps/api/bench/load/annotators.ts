import autocannon from "autocannon";
import type { Annotator } from "./people";
import type { Recorder } from "./stats";

type SentSpans = Array<{ start: number; end: number; type: string }>;

/** What one simulated annotator sent and what the API acknowledged. */
export type AnnotatorLog = {
  annotator: Annotator;
  /** Every 200 answer: the version it returned and the spans that save carried. */
  acks: Array<{ version: number; spans: SentSpans }>;
  /** Saves sent without an answer read (timed out, or in flight when the time ran out): they may have landed. */
  unanswered: SentSpans[];
  /** 409 stale_version answers (each after an unanswered save that had landed). */
  conflicts: number;
  /** Other refusals (status and the start of the body), kept to show what went wrong. */
  refusals: Array<{ status: number; body: string }>;
};

/**
 * Each annotator saves on their own connection with their own session, `rate` saves a second
 * (0: as fast as the answers come), for `seconds`. Like the workspace's autosaver, a save names the
 * version it started from and takes the version the answer returns; a 409 stale_version (a save
 * whose answer was lost had landed) takes the server's version from the answer's details and goes
 * on. The spans grow and shrink as an annotator adds and removes marks. Starts are spread over the
 * first second so that the saves do not arrive in lock step.
 */
export async function runAnnotators(base: string, annotators: Annotator[], opts: { seconds: number; rate: number; recorder: Recorder }): Promise<AnnotatorLog[]> {
  const logs: AnnotatorLog[] = annotators.map((annotator) => ({ annotator, acks: [], unanswered: [], conflicts: 0, refusals: [] }));
  await Promise.all(
    logs.map(async (log, i) => {
      await new Promise((r) => setTimeout(r, (i * 1000) / annotators.length));
      const st = { version: log.annotator.openedVersion, step: 0, pending: null as SentSpans | null };
      const instance = autocannon({
        url: log.annotator.url,
        connections: 1,
        ...(opts.rate > 0 ? { connectionRate: opts.rate } : {}),
        duration: opts.seconds,
        timeout: 10,
        requests: [
          {
            method: "PUT",
            setupRequest: (req) => {
              if (st.pending) log.unanswered.push(st.pending);
              st.step += 1;
              st.pending = log.annotator.candidates.slice(0, 10 + (st.step % 30));
              return {
                ...req,
                headers: { "Content-Type": "application/json", Accept: "application/json", Origin: base, Cookie: log.annotator.cookie },
                body: JSON.stringify({ version: st.version, spans: st.pending, dismissedSuggestions: [] }),
              };
            },
            onResponse: (status, body) => {
              const sent = st.pending;
              st.pending = null;
              if (status === 200 && sent) {
                st.version = (JSON.parse(body) as { version: number }).version;
                log.acks.push({ version: st.version, spans: sent });
                return;
              }
              const err = safeParse(body) as { error?: { code?: string; details?: { version?: number } } } | null;
              if (status === 409 && err?.error?.code === "stale_version" && typeof err.error.details?.version === "number") {
                st.version = err.error.details.version;
                log.conflicts += 1;
                return;
              }
              if (log.refusals.length < 5) log.refusals.push({ status, body: body.slice(0, 200) });
            },
          },
        ],
      });
      await opts.recorder.watch(instance);
      if (st.pending) log.unanswered.push(st.pending);
    }),
  );
  return logs;
}

function safeParse(body: string): unknown {
  try {
    return JSON.parse(body);
  } catch {
    return null;
  }
}
