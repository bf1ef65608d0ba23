import type { ExportQuery } from "@tagloom/contracts";

/**
 * The address of a streamed export. Exports are downloaded by the browser itself (a link with
 * `download`), not fetched into memory through the API client: the file may be far larger than a
 * page should hold, and the browser writes it to disk as it arrives.
 */
export function exportUrl(orgId: string, corpusId: string, query: ExportQuery): string {
  const qs = new URLSearchParams({ format: query.format, split: query.split });
  return `/api/orgs/${orgId}/corpora/${corpusId}/exports?${qs.toString()}`;
}
