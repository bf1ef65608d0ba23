import type { SuggesterCandidate } from "@tagloom/contracts";
import { type TaggerModel, loadModel } from "@tagloom/tagger";
import type { Db } from "@/db/types";
import { NotFoundError } from "@/errors";
import { getTagger, getTaggerModelText, listTaggers } from "@/training/taggers.service";

/** What the suggester needs to know about a tagger. */
export type SuggesterTagger = { id: string; corpusId: string; version: number; name: string };

/** A tagger of the corpus, or null (unknown, another corpus's, or another organization's). */
export async function findCorpusTagger(organizationId: string, corpusId: string, taggerId: string, db?: Db): Promise<SuggesterTagger | null> {
  try {
    const t = await getTagger(organizationId, corpusId, taggerId, db);
    return { id: t.id, corpusId: t.corpusId, version: t.version, name: t.label };
  } catch (err) {
    if (err instanceof NotFoundError) return null;
    throw err;
  }
}

/** The corpus's taggers that can suggest, newest first (the 100 newest). */
export async function listCorpusTaggers(organizationId: string, corpusId: string): Promise<SuggesterCandidate[]> {
  const page = await listTaggers(organizationId, corpusId, { limit: 100 });
  return page.items.map((t) => ({ id: t.id, version: t.version, name: t.label, createdAt: t.createdAt, f1: t.evaluation.documents > 0 ? t.evaluation.overall.f1 : null }));
}

// Taggers are immutable, so a loaded tagger stays valid for the life of the process. A few are
// kept (least recently used leave first) so that one process can serve several corpora.
const MAX_MODELS = 16;
type Loaded = { tagger: SuggesterTagger; model: TaggerModel };
const loaded = new Map<string, Promise<Loaded>>();

/** The corpus's tagger and its parsed model, read from the database once per process; NotFoundError when it is not the corpus's. */
export function loadTagger(organizationId: string, corpusId: string, taggerId: string): Promise<Loaded> {
  const key = `${organizationId}:${corpusId}:${taggerId}`;
  const cached = loaded.get(key);
  if (cached) {
    loaded.delete(key);
    loaded.set(key, cached);
    return cached;
  }
  const loading = (async () => {
    const tagger = await findCorpusTagger(organizationId, corpusId, taggerId);
    if (!tagger) throw new NotFoundError("tagger");
    const model = loadModel(JSON.parse(await getTaggerModelText(organizationId, corpusId, taggerId)));
    return { tagger, model };
  })();
  loading.catch(() => loaded.delete(key));
  loaded.set(key, loading);
  while (loaded.size > MAX_MODELS) loaded.delete(loaded.keys().next().value!);
  return loading;
}

/** The tagger's parsed model (see loadTagger). */
export async function loadTaggerModel(organizationId: string, corpusId: string, taggerId: string): Promise<TaggerModel> {
  return (await loadTagger(organizationId, corpusId, taggerId)).model;
}
