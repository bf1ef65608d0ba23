import type { UploadResult } from "@tagloom/contracts";
import type TestAgent from "supertest/lib/agent";

type Agent = TestAgent;

/** Creates a corpus and its entity types through the API; returns the corpus id and type ids by name. */
export async function createCorpusWithTypes(
  agent: Agent,
  orgId: string,
  name: string,
  types: Array<string | { name: string; hotkey?: string; color?: string }> = [],
): Promise<{ corpusId: string; typeIds: Record<string, string> }> {
  const res = await agent.post(`/api/orgs/${orgId}/corpora`).send({ name });
  if (res.status !== 201) throw new Error(`corpus create failed: ${res.status} ${JSON.stringify(res.body)}`);
  const corpusId: string = res.body.id;
  const typeIds: Record<string, string> = {};
  for (const t of types) {
    const body = typeof t === "string" ? { name: t } : t;
    const r = await agent.post(`/api/orgs/${orgId}/corpora/${corpusId}/entity-types`).send(body);
    if (r.status !== 201) throw new Error(`type create failed: ${r.status} ${JSON.stringify(r.body)}`);
    typeIds[body.name] = r.body.id;
  }
  return { corpusId, typeIds };
}

export type UploadInput = { name: string; content: string | Buffer };

/** Uploads files in one multipart request (the `files` field) with optional form fields. */
export function uploadFiles(agent: Agent, orgId: string, corpusId: string, files: UploadInput[], fields: Record<string, string> = {}) {
  let req = agent.post(`/api/orgs/${orgId}/corpora/${corpusId}/uploads`);
  for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
  for (const f of files) req = req.attach("files", typeof f.content === "string" ? Buffer.from(f.content, "utf8") : f.content, f.name);
  return req;
}

/** Polls an upload until none of its files is queued or processing; returns the final result. */
export async function waitForUpload(agent: Agent, orgId: string, corpusId: string, uploadId: string, timeoutMs = 30_000): Promise<UploadResult> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const res = await agent.get(`/api/orgs/${orgId}/corpora/${corpusId}/uploads/${uploadId}`);
    if (res.status !== 200) throw new Error(`upload read failed: ${res.status} ${JSON.stringify(res.body)}`);
    const result = res.body as UploadResult;
    if (result.upload.counts.queued === 0 && result.upload.counts.processing === 0) return result;
    if (Date.now() > deadline) throw new Error(`upload ${uploadId} still processing: ${JSON.stringify(result.upload.counts)}`);
    await new Promise((r) => setTimeout(r, 150));
  }
}

/** Uploads and waits; returns the final per-file results by file name. */
export async function uploadAndWait(agent: Agent, orgId: string, corpusId: string, files: UploadInput[], fields: Record<string, string> = {}) {
  const res = await uploadFiles(agent, orgId, corpusId, files, fields);
  if (res.status !== 202) throw new Error(`upload failed: ${res.status} ${JSON.stringify(res.body)}`);
  const result = await waitForUpload(agent, orgId, corpusId, res.body.upload.id);
  return { response: res.body as UploadResult, result, byName: Object.fromEntries(result.files.map((f) => [f.filename, f])) };
}
