import type { Role } from "@tagloom/contracts";
import type { TenantFixture } from "./tenant-fixture";

export type CatalogRoute = {
  method: "get" | "post" | "put" | "patch" | "delete";
  /** Path under /api with :orgId and other :params filled from the fixture by `path(f)`. */
  path: (f: TenantFixture) => string;
  /** Roles the route lets through (admin is always allowed). */
  roles: readonly Role[];
  /**
   * A body that would succeed if the caller were allowed, used against the other organization
   * (which must answer 404 and change nothing).
   */
  body?: (f: TenantFixture) => unknown;
  /**
   * A body for the role matrix. It must not destroy the fixture when the role is allowed
   * (e.g. an invalid body answering 400 or an unknown id answering 404): the matrix only checks
   * that allowed roles get past the role guard and the others get 403.
   */
  probe?: (f: TenantFixture) => unknown;
  /**
   * The exact status an allowed role gets in the role matrix, when it differs from the default
   * (`get` → 200; a probe → 400; no probe, so an unknown id → 404). A number for every allowed
   * role, or per role. Exact, so that a 500 behind the role guard fails the matrix.
   */
  allowedStatus?: number | Partial<Record<Role, number>>;
};

const ALL: readonly Role[] = ["admin", "manager", "data_lead", "annotator"];
const ADMIN: readonly Role[] = ["admin"];
const MANAGER: readonly Role[] = ["admin", "manager"];
const NO_SUCH_ID = "00000000-0000-4000-8000-000000000000";

/** Every tenant route. Each feature adds its routes here; tenancy.test.ts runs them all. */
export const routeCatalog: CatalogRoute[] = [
  { method: "get", path: (f) => `/orgs/${f.orgId}`, roles: ALL },
  { method: "patch", path: (f) => `/orgs/${f.orgId}`, roles: ADMIN, body: () => ({ name: "Renamed By Intruder" }), probe: () => ({ name: "" }) },
  { method: "delete", path: (f) => `/orgs/${f.orgId}`, roles: ADMIN, body: () => ({ confirmName: "Tenant B" }), probe: () => ({ confirmName: "not the name" }) },
  { method: "get", path: (f) => `/orgs/${f.orgId}/members`, roles: ALL },
  {
    method: "patch",
    path: (f) => `/orgs/${f.orgId}/members/${f.memberUserId}`,
    roles: ADMIN,
    body: () => ({ role: "admin" }),
    probe: () => ({ role: "not-a-role" }),
  },
  { method: "delete", path: (f) => `/orgs/${f.orgId}/members/${f.memberUserId}`, roles: ADMIN },
  { method: "get", path: (f) => `/orgs/${f.orgId}/invitations`, roles: ADMIN },
  {
    method: "post",
    path: (f) => `/orgs/${f.orgId}/invitations`,
    roles: ADMIN,
    body: () => ({ email: "intruder-invite@example.test", role: "admin" }),
    probe: () => ({ email: "not an address", role: "annotator" }),
  },
  { method: "post", path: (f) => `/orgs/${f.orgId}/invitations/${f.invitationId}/resend`, roles: ADMIN },
  { method: "delete", path: (f) => `/orgs/${f.orgId}/invitations/${f.invitationId}`, roles: ADMIN },
  { method: "get", path: (f) => `/orgs/${f.orgId}/audit`, roles: ADMIN },
  // Seats and billing (issue 11): admins only. The probes fail validation or find no
  // subscription (409), so the fixture's billing never changes.
  { method: "get", path: (f) => `/orgs/${f.orgId}/billing`, roles: ADMIN },
  { method: "post", path: (f) => `/orgs/${f.orgId}/billing/checkout`, roles: ADMIN, body: () => ({ seats: 60 }), probe: () => ({ seats: 0 }) },
  { method: "post", path: (f) => `/orgs/${f.orgId}/billing/seats`, roles: ADMIN, body: () => ({ seats: 60 }), probe: () => ({ seats: "many" }) },
  { method: "post", path: (f) => `/orgs/${f.orgId}/billing/cancel`, roles: ADMIN, allowedStatus: 409 },
  { method: "post", path: (f) => `/orgs/${f.orgId}/billing/resume`, roles: ADMIN, allowedStatus: 409 },
  { method: "post", path: (f) => `/orgs/${f.orgId}/billing/retry-payment`, roles: ADMIN, allowedStatus: 409 },
  // Batches, assignments and review (issue 6).
  { method: "get", path: (f) => `/orgs/${f.orgId}/batches`, roles: MANAGER },
  { method: "get", path: (f) => `/orgs/${f.orgId}/corpora/${f.ids.annotationCorpusId}/batches`, roles: MANAGER },
  {
    method: "post",
    path: (f) => `/orgs/${f.orgId}/corpora/${f.ids.annotationCorpusId}/batches`,
    roles: MANAGER,
    body: (f) => ({ name: "Intruder batch", documentIds: [f.ids.batchDocumentId], assignment: { mode: "round_robin", annotatorIds: [f.annotator.userId], annotatorsPerDocument: 1 } }),
    probe: () => ({ name: "" }),
  },
  { method: "get", path: (f) => `/orgs/${f.orgId}/corpora/${f.ids.annotationCorpusId}/batches/${f.ids.batchId}`, roles: MANAGER },
  { method: "get", path: (f) => `/orgs/${f.orgId}/corpora/${f.ids.annotationCorpusId}/batches/${f.ids.batchId}/agreement`, roles: MANAGER },
  { method: "get", path: (f) => `/orgs/${f.orgId}/queue`, roles: ALL },
  // Only the assignee and managers see an assignment; for anyone else it does not exist.
  { method: "get", path: (f) => `/orgs/${f.orgId}/corpora/${f.ids.annotationCorpusId}/assignments/${f.ids.assignmentId}`, roles: ALL, allowedStatus: { data_lead: 404 } },
  {
    method: "put",
    path: (f) => `/orgs/${f.orgId}/corpora/${f.ids.annotationCorpusId}/assignments/${f.ids.assignmentId}`,
    roles: ALL,
    body: () => ({ version: 0, spans: [{ start: 0, end: 4, type: "PERSON" }] }),
    probe: () => ({ version: -1, spans: [] }),
  },
  {
    method: "post",
    path: (f) => `/orgs/${f.orgId}/corpora/${f.ids.annotationCorpusId}/assignments/${f.ids.assignmentId}/submit`,
    roles: ALL,
    body: () => ({ version: 0 }),
    probe: () => ({ version: "latest" }),
  },
  { method: "get", path: (f) => `/orgs/${f.orgId}/review`, roles: MANAGER },
  { method: "get", path: (f) => `/orgs/${f.orgId}/corpora/${f.ids.annotationCorpusId}/batches/${f.ids.batchId}/documents/${f.ids.batchDocumentId}/review`, roles: MANAGER },
  {
    method: "post",
    path: (f) => `/orgs/${f.orgId}/corpora/${f.ids.annotationCorpusId}/batches/${f.ids.batchId}/documents/${f.ids.batchDocumentId}/settle`,
    roles: MANAGER,
    body: () => ({ spans: [{ start: 0, end: 4, type: "PERSON" }] }),
    probe: () => ({ spans: "none" }),
  },
  { method: "post", path: (f) => `/orgs/${f.orgId}/corpora/${f.ids.annotationCorpusId}/assignments/${f.ids.assignmentId}/accept`, roles: MANAGER },
  {
    method: "post",
    path: (f) => `/orgs/${f.orgId}/corpora/${f.ids.annotationCorpusId}/assignments/${f.ids.assignmentId}/return`,
    roles: MANAGER,
    body: () => ({ comment: "Please look again." }),
    probe: () => ({ comment: "" }),
  },
  // Corpora, entity types, documents, uploads and exports (issue 5).
  ...corpusRoutes(),
  // API tokens, the suggester and the most-uncertain ranking (issue 10).
  ...suggesterRoutes(),
  // Training runs, taggers and comparisons (issue 9).
  ...trainingRoutes(),
];

function suggesterRoutes(): CatalogRoute[] {
  const LEAD: readonly Role[] = ["admin", "data_lead"];
  return [
    { method: "get", path: (f) => `/orgs/${f.orgId}/tokens`, roles: LEAD },
    { method: "post", path: (f) => `/orgs/${f.orgId}/tokens`, roles: LEAD, body: () => ({ name: "Intruder token" }), probe: () => ({ name: "" }) },
    { method: "delete", path: (f) => `/orgs/${f.orgId}/tokens/${f.ids.apiTokenId}`, roles: LEAD },
    { method: "get", path: (f) => `/orgs/${f.orgId}/corpora/${f.ids.corpusId}/suggester`, roles: ALL },
    {
      method: "put",
      path: (f) => `/orgs/${f.orgId}/corpora/${f.ids.corpusId}/suggester`,
      roles: LEAD,
      body: (f) => ({ taggerId: f.ids.taggerId }),
      probe: () => ({ taggerId: "not-a-tagger" }),
    },
    { method: "get", path: (f) => `/orgs/${f.orgId}/corpora/${f.ids.corpusId}/uncertain`, roles: ["admin", "manager", "data_lead"], allowedStatus: 409 },
  ];
}

function trainingRoutes(): CatalogRoute[] {
  const corpus = (f: TenantFixture) => `/orgs/${f.orgId}/corpora/${f.ids.corpusId}`;
  const TRAINERS: readonly Role[] = ["admin", "data_lead"];
  const READERS: readonly Role[] = ["admin", "manager", "data_lead"];
  const tagger = (f: TenantFixture) => `${corpus(f)}/taggers/${f.ids.taggerId}`;
  const compare = (f: TenantFixture) => `${tagger(f)}/compare/${f.ids.otherTaggerId}`;
  return [
    // The probe is a bad config (400): allowed roles get past the guard, nothing is queued.
    { method: "post", path: (f) => `${corpus(f)}/runs`, roles: TRAINERS, body: () => ({}), probe: () => ({ order: 3 }) },
    { method: "get", path: (f) => `${corpus(f)}/runs`, roles: READERS },
    { method: "get", path: (f) => `${corpus(f)}/runs/${f.ids.runId}`, roles: READERS },
    { method: "post", path: (f) => `${corpus(f)}/runs/${f.ids.runId}/cancel`, roles: TRAINERS },
    { method: "post", path: (f) => `${corpus(f)}/runs/${f.ids.runId}/repeat`, roles: TRAINERS },
    { method: "get", path: (f) => `${corpus(f)}/taggers`, roles: READERS },
    { method: "get", path: (f) => tagger(f), roles: READERS },
    { method: "get", path: (f) => `${tagger(f)}/download`, roles: TRAINERS },
    { method: "get", path: (f) => `${tagger(f)}/evaluation`, roles: TRAINERS },
    // The fixture's taggers were made without runs, so there is no test split to compare on (409).
    { method: "get", path: (f) => compare(f), roles: READERS, allowedStatus: 409 },
    { method: "get", path: (f) => `${compare(f)}/documents/${f.ids.documentId}`, roles: READERS, allowedStatus: 409 },
  ];
}

function corpusRoutes(): CatalogRoute[] {
  const corpus = (f: TenantFixture) => `/orgs/${f.orgId}/corpora/${f.ids.corpusId}`;
  const type = (f: TenantFixture) => `${corpus(f)}/entity-types/${f.ids.entityTypeId}`;
  const EXPORTERS: readonly Role[] = ["admin", "manager", "data_lead"];
  const CORPUS_DATA: readonly Role[] = ["admin", "manager", "data_lead"];
  return [
    { method: "get", path: (f) => `/orgs/${f.orgId}/corpora`, roles: ALL },
    { method: "post", path: (f) => `/orgs/${f.orgId}/corpora`, roles: MANAGER, body: () => ({ name: "Intruder corpus" }), probe: () => ({ name: " " }) },
    { method: "get", path: corpus, roles: ALL },
    { method: "patch", path: corpus, roles: MANAGER, body: () => ({ name: "Renamed by intruder", archived: true }), probe: () => ({}) },
    { method: "delete", path: corpus, roles: MANAGER, body: () => ({ confirmName: "Fixture corpus" }), probe: () => ({ confirmName: "not the name" }) },
    { method: "get", path: (f) => `${corpus(f)}/entity-types`, roles: ALL },
    { method: "post", path: (f) => `${corpus(f)}/entity-types`, roles: MANAGER, body: () => ({ name: "INTRUDER" }), probe: () => ({ name: "not upper" }) },
    { method: "patch", path: type, roles: MANAGER, body: () => ({ name: "RENAMED", hotkey: "z" }), probe: () => ({}) },
    { method: "get", path: (f) => `${type(f)}/usage`, roles: MANAGER },
    { method: "delete", path: type, roles: MANAGER, body: () => ({ confirm: true }), probe: () => ({ confirm: "yes" }) },
    // Annotators see documents only through their assignments (issue 14).
    { method: "get", path: (f) => `${corpus(f)}/documents?q=harbour&sort=title`, roles: CORPUS_DATA },
    {
      method: "post",
      path: (f) => `${corpus(f)}/documents/split`,
      roles: MANAGER,
      body: (f) => ({ documentIds: [f.ids.documentId], split: "test" }),
      probe: () => ({ testPercent: 500, seed: 1 }),
    },
    { method: "get", path: (f) => `${corpus(f)}/documents/${f.ids.documentId}`, roles: CORPUS_DATA },
    { method: "delete", path: (f) => `${corpus(f)}/documents/${f.ids.documentId}`, roles: MANAGER },
    { method: "get", path: (f) => `${corpus(f)}/uploads/limits`, roles: ALL },
    // A JSON body carries no files: allowed roles get 400, and nothing is stored.
    { method: "post", path: (f) => `${corpus(f)}/uploads`, roles: MANAGER, body: () => ({ spanMode: "gold" }), probe: () => ({}) },
    { method: "get", path: (f) => `${corpus(f)}/uploads`, roles: CORPUS_DATA },
    { method: "get", path: (f) => `${corpus(f)}/uploads/${f.ids.uploadId}`, roles: CORPUS_DATA },
    { method: "get", path: (f) => `${corpus(f)}/files?state=ready`, roles: CORPUS_DATA },
    { method: "get", path: (f) => `${corpus(f)}/exports?format=jsonl&split=all`, roles: EXPORTERS },
    { method: "get", path: (f) => `${corpus(f)}/exports?format=conll&split=train`, roles: EXPORTERS },
  ];
}

/** The status the role matrix expects for an allowed role (see `CatalogRoute.allowedStatus`). */
export function allowedStatusFor(route: CatalogRoute, role: Role): number {
  const declared = typeof route.allowedStatus === "number" ? route.allowedStatus : route.allowedStatus?.[role];
  if (declared !== undefined) return declared;
  if (route.method === "get") return 200;
  return route.probe ? 400 : 404;
}

/** For routes whose probe must not act on the fixture's real object. */
export function withUnknownId(path: string, realId: string): string {
  return path.replace(realId, NO_SUCH_ID);
}
