import { db } from "@/db/knex";
import { createCorpusWithTypes } from "./corpora";
import { type SignedIn, type TestServer, addSignedInMember, signUpFounder, startTestServer } from "./http";
import { startTestWorkers } from "./workers";

export type ManagerCorpus = { server: TestServer; admin: SignedIn; manager: SignedIn; corpusId: string; typeIds: Record<string, string> };

/**
 * The setup of upload tests: the app with its job workers in this process, a founder's
 * organization, a manager in it, and the manager's corpus with these entity types.
 */
export async function startManagerCorpus(organizationName: string, corpusName: string, types: string[]): Promise<ManagerCorpus> {
  const server = await startTestServer();
  await startTestWorkers();
  const admin = await signUpFounder(server, { organizationName });
  const manager = await addSignedInMember(server, admin.orgId, "manager");
  const { corpusId, typeIds } = await createCorpusWithTypes(manager.agent, admin.orgId, corpusName, types);
  return { server, admin, manager, corpusId, typeIds };
}

/** How many documents the corpus holds (read from the table, not through the API). */
export async function countDocuments(corpusId: string): Promise<number> {
  return Number((await db("documents").where({ corpus_id: corpusId }).count<{ count: string }[]>("* as count"))[0]!.count);
}
