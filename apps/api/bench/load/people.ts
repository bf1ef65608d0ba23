import { tokenizeText } from "@tagloom/tagger";

export type Annotator = {
  userId: string;
  cookie: string;
  assignmentId: string;
  url: string;
  /** Spans this annotator marks, in text order (a growing and shrinking prefix is saved). */
  candidates: Array<{ start: number; end: number; type: string }>;
  /** Version the workspace opened at (GET of the assignment). */
  openedVersion: number;
};
export type Manager = { userId: string; cookie: string };
export type LoadOrg = {
  orgId: string;
  corpusId: string;
  typeIds: Record<string, string>;
  annotators: Annotator[];
  managers: Manager[];
  documentCount: number;
  tokensPerAnnotatorDocument: number;
  signInsUsed: number;
  signInLimitLeft: string;
};

const PASSWORD = "loom-load-password-7";

// An invented text of about 1,000 tokens with a name in every sentence (the names are made up).
export function annotatorText(seed: number): string {
  const first = ["Mira", "Tobin", "Orla", "Edda", "Jory", "Ines", "Hale", "Kit", "Wren", "Brisa"];
  const last = ["Quell", "Vale", "Finch", "Rusk", "Marrow", "Ashby", "Thorne", "Lisle"];
  const sentences: string[] = [];
  for (let i = 0; i < 80; i++) {
    const name = `${first[(i + seed) % first.length]} ${last[(i * 3 + seed) % last.length]}`;
    sentences.push(`On day ${i + 1} ${name} counted the crates at the Saltmarsh depot and signed for them.`);
  }
  return sentences.join(" ");
}

function cookieOf(res: Response): string {
  return res.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
}

async function expectStatus(res: Response, status: number, what: string): Promise<void> {
  if (res.status !== status) throw new Error(`${what}: expected ${status}, got ${res.status} ${(await res.text()).slice(0, 300)}`);
}

/**
 * One organization with `annotatorCount` annotators (one document each, assigned by hand in one
 * batch) and `managerCount` managers, in a corpus padded with `extraDocuments` more documents so
 * that the Documents table has many pages.
 *
 * Sessions: the founder signs up and the managers sign in through the routes (11 attempts, inside
 * the default sign-in limit of 20 per address per 15 minutes); the annotators come back with a
 * session made by lucia.createSession, as after an earlier sign-in (load.ts says why).
 */
export async function createLoadOrg(base: string, opts: { annotatorCount: number; managerCount: number; extraDocuments: number }): Promise<LoadOrg> {
  const { hashPassword } = await import("../../src/auth/passwords");
  const { insertUser } = await import("../../src/auth/users.repository");
  const { addMember } = await import("../../src/members/members.service");
  const { lucia } = await import("../../src/auth/lucia");
  const { db } = await import("../../src/db/knex");
  const { createAnnotationData } = await import("../../test/support/annotation-data");
  const { seedDocuments } = await import("../support/seed-documents");
  const json = { "Content-Type": "application/json", Origin: base };

  const founderEmail = "founder@load.example.test";
  const signUp = await fetch(`${base}/api/auth/sign-up`, {
    method: "POST",
    headers: json,
    body: JSON.stringify({ email: founderEmail, password: PASSWORD, name: "Load Founder", organizationName: "Loomfield Cooperative" }),
  });
  await expectStatus(signUp, 201, "sign-up");
  const founder = (await signUp.json()) as { user: { id: string }; organizationId: string };
  const founderCookie = cookieOf(signUp);
  const orgId = founder.organizationId;

  const hash = await hashPassword(PASSWORD);
  const annotatorIds: string[] = [];
  for (let i = 0; i < opts.annotatorCount; i++) {
    const user = await insertUser({ email: `annotator-${i}@load.example.test`, name: `Annotator ${i}`, passwordHash: hash, emailVerified: true });
    await addMember(orgId, user.id, "annotator");
    annotatorIds.push(user.id);
  }
  const managerEmails: string[] = [];
  const managerIds: string[] = [];
  for (let i = 0; i < opts.managerCount; i++) {
    const email = `manager-${i}@load.example.test`;
    const user = await insertUser({ email, name: `Manager ${i}`, passwordHash: hash, emailVerified: true });
    await addMember(orgId, user.id, "manager");
    managerEmails.push(email);
    managerIds.push(user.id);
  }

  const data = await createAnnotationData(orgId, { userId: founder.user.id, email: founderEmail }, {
    corpusName: "Depot ledgers",
    types: [{ name: "PERSON", hotkey: "p" }, { name: "PLACE", hotkey: "l" }],
    documents: annotatorIds.map((_, i) => ({ title: `Depot ledger ${String(i).padStart(3, "0")}`, text: annotatorText(i) })),
  });
  const typeIds = Object.fromEntries(Object.entries(data.types).map(([name, t]) => [name, t.id]));
  await seedDocuments(db, { organizationId: orgId, corpusId: data.corpusId, count: opts.extraDocuments, tokens: 120, goldTypeId: typeIds.PLACE!, goldEvery: 3, userId: founder.user.id });

  const batchRes = await fetch(`${base}/api/orgs/${orgId}/corpora/${data.corpusId}/batches`, {
    method: "POST",
    headers: { ...json, Cookie: founderCookie },
    body: JSON.stringify({
      name: "Depot ledgers, first pass",
      documentIds: data.documentIds,
      assignment: { mode: "by_hand", documents: data.documentIds.map((documentId, i) => ({ documentId, annotatorIds: [annotatorIds[i]!] })) },
    }),
  });
  await expectStatus(batchRes, 201, "batch");
  const batchId = ((await batchRes.json()) as { id: string }).id;
  const detailRes = await fetch(`${base}/api/orgs/${orgId}/corpora/${data.corpusId}/batches/${batchId}`, { headers: { Cookie: founderCookie } });
  await expectStatus(detailRes, 200, "batch detail");
  const detail = (await detailRes.json()) as { documents: Array<{ documentId: string; assignments: Array<{ id: string; annotatorId: string }> }> };

  const managers: Manager[] = [];
  let signInLimitLeft = "";
  for (let i = 0; i < managerIds.length; i++) {
    const res = await fetch(`${base}/api/auth/sign-in`, { method: "POST", headers: json, body: JSON.stringify({ email: managerEmails[i], password: PASSWORD }) });
    await expectStatus(res, 200, `sign-in of manager ${i}`);
    signInLimitLeft = res.headers.get("ratelimit") ?? "";
    managers.push({ userId: managerIds[i]!, cookie: cookieOf(res) });
  }

  const annotators: Annotator[] = [];
  for (let i = 0; i < annotatorIds.length; i++) {
    const userId = annotatorIds[i]!;
    const session = await lucia.createSession(userId, { created_at: new Date() });
    const cookie = `${lucia.sessionCookieName}=${session.id}`;
    await expectStatus(await fetch(`${base}/api/me`, { headers: { Cookie: cookie } }), 200, `session of annotator ${i}`);
    const doc = detail.documents.find((d) => d.assignments[0]!.annotatorId === userId)!;
    const assignmentId = doc.assignments[0]!.id;
    const url = `${base}/api/orgs/${orgId}/corpora/${data.corpusId}/assignments/${assignmentId}`;
    // The workspace opens the assignment first and saves from the version it got.
    const view = await fetch(url, { headers: { Cookie: cookie } });
    await expectStatus(view, 200, `assignment of annotator ${i}`);
    const openedVersion = ((await view.json()) as { version: number }).version;
    const text = annotatorText(i);
    const { tokens } = tokenizeText(text);
    const candidates: Annotator["candidates"] = [];
    for (let t = 0; t + 3 < tokens.length; t++) {
      // "On day N <First> <Last> counted": the name is tokens t+2 and t+3.
      if (text.slice(tokens[t]!.start, tokens[t]!.end) === "day") {
        candidates.push({ start: tokens[t + 2]!.start, end: tokens[t + 3]!.end, type: candidates.length % 4 === 3 ? "PLACE" : "PERSON" });
      }
    }
    annotators.push({ userId, cookie, assignmentId, url, candidates, openedVersion });
  }
  const tokensPerAnnotatorDocument = tokenizeText(annotatorText(0)).tokens.length;
  return {
    orgId,
    corpusId: data.corpusId,
    typeIds,
    annotators,
    managers,
    documentCount: data.documentIds.length + opts.extraDocuments,
    tokensPerAnnotatorDocument,
    signInsUsed: 1 + managers.length,
    signInLimitLeft,
  };
}
