import { getDocumentForAnnotation } from "@/documents/documents.service";

/** What a save is checked against: the text's length and its token offsets. */
export type TokenBounds = { textLength: number; starts: number[]; ends: number[] };

// Autosave checks every span against the document's tokens. Tokens never change after import, so
// they are kept here between saves instead of being read (up to 50,000 offsets twice) each time.
const MAX_TOKENS = 2_000_000;
const cache = new Map<string, TokenBounds>();
let cachedTokens = 0;

/** The token bounds of an organization's document (NotFoundError when it is missing). */
export async function getTokenBounds(organizationId: string, documentId: string): Promise<TokenBounds> {
  const key = `${organizationId}/${documentId}`;
  const hit = cache.get(key);
  if (hit) {
    cache.delete(key);
    cache.set(key, hit);
    return hit;
  }
  const doc = await getDocumentForAnnotation(organizationId, documentId);
  const bounds = { textLength: doc.text.length, starts: doc.tokens.starts, ends: doc.tokens.ends };
  rememberTokenBounds(key, bounds);
  return bounds;
}

function rememberTokenBounds(key: string, bounds: TokenBounds): void {
  cache.set(key, bounds);
  cachedTokens += bounds.starts.length;
  for (const [oldKey, old] of cache) {
    if (cachedTokens <= MAX_TOKENS || oldKey === key) break;
    cache.delete(oldKey);
    cachedTokens -= old.starts.length;
  }
}

/** Keeps bounds already loaded with the full document (the workspace's first read). */
export function primeTokenBounds(organizationId: string, documentId: string, bounds: TokenBounds): void {
  const key = `${organizationId}/${documentId}`;
  if (!cache.has(key)) rememberTokenBounds(key, bounds);
}
