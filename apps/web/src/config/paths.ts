/** Every route of the web app, in one place. Build links with these, never by hand. */
export const paths = {
  home: { path: "/", build: () => "/" },
  signIn: { path: "/sign-in", build: (next?: string) => (next ? `/sign-in?next=${encodeURIComponent(next)}` : "/sign-in") },
  signUp: { path: "/sign-up", build: () => "/sign-up" },
  forgotPassword: { path: "/forgot-password", build: () => "/forgot-password" },
  resetPassword: { path: "/reset-password", build: () => "/reset-password" },
  verifyEmail: { path: "/verify-email", build: () => "/verify-email" },
  invitation: { path: "/invitations/:token", build: (token: string) => `/invitations/${token}` },
  outbox: { path: "/dev/outbox", build: () => "/dev/outbox" },
  newOrganization: { path: "/new-organization", build: () => "/new-organization" },
  org: {
    root: { path: "/o/:orgId", build: (orgId: string) => `/o/${orgId}` },
    corpora: { path: "/o/:orgId/corpora", build: (orgId: string) => `/o/${orgId}/corpora` },
    corpus: { path: "/o/:orgId/corpora/:corpusId", build: (orgId: string, corpusId: string) => `/o/${orgId}/corpora/${corpusId}` },
    corpusSchema: { path: "/o/:orgId/corpora/:corpusId/schema", build: (orgId: string, corpusId: string) => `/o/${orgId}/corpora/${corpusId}/schema` },
    corpusUploads: { path: "/o/:orgId/corpora/:corpusId/uploads", build: (orgId: string, corpusId: string) => `/o/${orgId}/corpora/${corpusId}/uploads` },
    corpusSuggester: { path: "/o/:orgId/corpora/:corpusId/suggester", build: (orgId: string, corpusId: string) => `/o/${orgId}/corpora/${corpusId}/suggester` },
    corpusUncertain: { path: "/o/:orgId/corpora/:corpusId/uncertain", build: (orgId: string, corpusId: string) => `/o/${orgId}/corpora/${corpusId}/uncertain` },
    corpusTraining: { path: "/o/:orgId/corpora/:corpusId/training", build: (orgId: string, corpusId: string) => `/o/${orgId}/corpora/${corpusId}/training` },
    newRun: { path: "/o/:orgId/corpora/:corpusId/training/new", build: (orgId: string, corpusId: string) => `/o/${orgId}/corpora/${corpusId}/training/new` },
    run: {
      path: "/o/:orgId/corpora/:corpusId/training/runs/:runId",
      build: (orgId: string, corpusId: string, runId: string) => `/o/${orgId}/corpora/${corpusId}/training/runs/${runId}`,
    },
    tagger: {
      path: "/o/:orgId/corpora/:corpusId/training/taggers/:taggerId",
      build: (orgId: string, corpusId: string, taggerId: string) => `/o/${orgId}/corpora/${corpusId}/training/taggers/${taggerId}`,
    },
    compare: {
      path: "/o/:orgId/corpora/:corpusId/training/taggers/:taggerId/compare/:otherId",
      build: (orgId: string, corpusId: string, taggerId: string, otherId: string) => `/o/${orgId}/corpora/${corpusId}/training/taggers/${taggerId}/compare/${otherId}`,
    },
    compareDocument: {
      path: "/o/:orgId/corpora/:corpusId/training/taggers/:taggerId/compare/:otherId/documents/:documentId",
      build: (orgId: string, corpusId: string, taggerId: string, otherId: string, documentId: string) =>
        `/o/${orgId}/corpora/${corpusId}/training/taggers/${taggerId}/compare/${otherId}/documents/${documentId}`,
    },
    corpusSettings: { path: "/o/:orgId/corpora/:corpusId/settings", build: (orgId: string, corpusId: string) => `/o/${orgId}/corpora/${corpusId}/settings` },
    document: {
      path: "/o/:orgId/corpora/:corpusId/documents/:documentId",
      build: (orgId: string, corpusId: string, documentId: string) => `/o/${orgId}/corpora/${corpusId}/documents/${documentId}`,
    },
    queue: { path: "/o/:orgId/queue", build: (orgId: string) => `/o/${orgId}/queue` },
    batches: { path: "/o/:orgId/batches", build: (orgId: string) => `/o/${orgId}/batches` },
    taggers: { path: "/o/:orgId/taggers", build: (orgId: string) => `/o/${orgId}/taggers` },
    members: { path: "/o/:orgId/members", build: (orgId: string) => `/o/${orgId}/members` },
    audit: { path: "/o/:orgId/audit", build: (orgId: string) => `/o/${orgId}/audit` },
    billing: { path: "/o/:orgId/billing", build: (orgId: string) => `/o/${orgId}/billing` },
    settings: { path: "/o/:orgId/settings", build: (orgId: string) => `/o/${orgId}/settings` },
    apiTokens: { path: "/o/:orgId/tokens", build: (orgId: string) => `/o/${orgId}/tokens` },
    newBatch: {
      path: "/o/:orgId/batches/new",
      build: (orgId: string, opts: { corpusId?: string; documentIds?: string[] } = {}) => {
        const q = new URLSearchParams();
        if (opts.corpusId) q.set("corpus", opts.corpusId);
        if (opts.documentIds?.length) q.set("documents", opts.documentIds.join(","));
        const s = q.toString();
        return `/o/${orgId}/batches/new${s ? `?${s}` : ""}`;
      },
    },
    batch: {
      path: "/o/:orgId/corpora/:corpusId/batches/:batchId",
      build: (orgId: string, corpusId: string, batchId: string) => `/o/${orgId}/corpora/${corpusId}/batches/${batchId}`,
    },
    assignment: {
      path: "/o/:orgId/corpora/:corpusId/assignments/:assignmentId",
      build: (orgId: string, corpusId: string, assignmentId: string) => `/o/${orgId}/corpora/${corpusId}/assignments/${assignmentId}`,
    },
    review: { path: "/o/:orgId/review", build: (orgId: string) => `/o/${orgId}/review` },
    reviewDocument: {
      path: "/o/:orgId/corpora/:corpusId/batches/:batchId/review/:documentId",
      build: (orgId: string, corpusId: string, batchId: string, documentId: string) =>
        `/o/${orgId}/corpora/${corpusId}/batches/${batchId}/review/${documentId}`,
    },
  },
} as const;
