/** Query keys below a corpus (same prefix as the corpus's queries). */
export const corpusKey = (orgId: string, corpusId: string) => ["orgs", orgId, "corpora", corpusId] as const;
