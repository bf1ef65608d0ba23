import { corpusKey } from "@/features/corpora/api/keys";

/** Query keys of a corpus's training runs and taggers. */
export const runsKey = (orgId: string, corpusId: string) => [...corpusKey(orgId, corpusId), "runs"] as const;
export const taggersKey = (orgId: string, corpusId: string) => [...corpusKey(orgId, corpusId), "taggers"] as const;
/** Where the API keeps a corpus's training resources. */
export const corpusApi = (orgId: string, corpusId: string) => `/orgs/${orgId}/corpora/${corpusId}`;
