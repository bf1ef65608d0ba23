/** Query keys of corpora and everything below a corpus; mutations invalidate by these prefixes. */
export const corporaKey = (orgId: string) => ["orgs", orgId, "corpora"] as const;
export const corpusKey = (orgId: string, corpusId: string) => ["orgs", orgId, "corpora", corpusId] as const;
