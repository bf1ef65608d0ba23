/** Query keys below a corpus; the same prefix as the corpus's own queries, so invalidating a corpus refreshes them. */
export const corpusKey = (orgId: string, corpusId: string) => ["orgs", orgId, "corpora", corpusId] as const;
export const documentsKey = (orgId: string, corpusId: string) => [...corpusKey(orgId, corpusId), "documents"] as const;
