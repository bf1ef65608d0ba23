import { insertTagger } from "@/training/taggers.service";

/** Stores a trained model as the corpus's next tagger (as a run's storing stage would, without a run). */
export async function createTestTagger(organizationId: string, corpusId: string, modelText: string, _userId?: string): Promise<{ id: string; version: number }> {
  const t = await insertTagger({ organizationId, corpusId, modelText });
  return { id: t.id, version: t.version };
}
