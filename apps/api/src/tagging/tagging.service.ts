import { type TagRequest, type TagResponse, taggingLimits } from "@tagloom/contracts";
import { ConflictError, NotFoundError, PayloadTooLargeError } from "@/errors";
import { tagText } from "./tag-text";
import { getCorpusSuggesterForTagging } from "@/suggestions/suggestions.service";
import { loadTagger } from "./tagger-source";

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
  // No query per request besides the token's: the suggester (for a moment), its tagger and model are cached.
  const suggester = await getCorpusSuggesterForTagging(organizationId, corpusId);
  if (!suggester) throw new NotFoundError("corpus");
  if (!suggester.taggerId) throw new ConflictError("This corpus has no suggester: a data lead must pick one of its taggers before the tagging API can use it.", null, "no_suggester");
  const { tagger, model } = await loadTagger(organizationId, corpusId, suggester.taggerId);
  return { tagger: { id: tagger.id, version: tagger.version }, results: texts.map((t) => ({ spans: tagText(model, t) })) };
}
