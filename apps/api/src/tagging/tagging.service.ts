import { type TagRequest, type TagResponse, taggingLimits } from "@tagloom/contracts";
import { getCorpus } from "@/corpora/corpora.service";
import { ConflictError, PayloadTooLargeError } from "@/errors";
import { getCorpusSuggesterId } from "@/suggestions/suggestions.service";
import { tagText } from "./tag-text";
import { findCorpusTagger, loadTaggerModel } from "./tagger-source";

function checkLimits(texts: string[]): void {
  const { maxTexts, maxCharsPerText, maxTotalChars } = taggingLimits;
  const limits = { maxTexts, maxCharsPerText, maxTotalChars };
  if (texts.length > maxTexts) throw new PayloadTooLargeError(`Send at most ${maxTexts} texts per request (this one has ${texts.length}).`, { limits });
  const long = texts.findIndex((t) => t.length > maxCharsPerText);
  if (long >= 0) throw new PayloadTooLargeError(`Text ${long + 1} has ${texts[long]!.length} characters; the limit is ${maxCharsPerText} per text.`, { limits, index: long });
  const total = texts.reduce((n, t) => n + t.length, 0);
  if (total > maxTotalChars) throw new PayloadTooLargeError(`The texts have ${total} characters together; the limit is ${maxTotalChars} per request.`, { limits });
}

/** Tags texts with the corpus's suggester for an API token of the corpus's organization. */
export async function tagTextsForToken(organizationId: string, corpusId: string, body: TagRequest): Promise<TagResponse> {
  const texts = body.texts ?? [body.text!];
  checkLimits(texts);
  await getCorpus(organizationId, corpusId);
  const taggerId = await getCorpusSuggesterId(organizationId, corpusId);
  if (!taggerId) throw new ConflictError("This corpus has no suggester: a data lead must pick one of its taggers before the tagging API can use it.", null, "no_suggester");
  const tagger = await findCorpusTagger(organizationId, corpusId, taggerId);
  if (!tagger) throw new ConflictError("The corpus's suggester is no longer available; a data lead must pick another tagger.", null, "no_suggester");
  const model = await loadTaggerModel(organizationId, corpusId, taggerId);
  return { tagger: { id: tagger.id, version: tagger.version }, results: texts.map((t) => ({ spans: tagText(model, t) })) };
}
