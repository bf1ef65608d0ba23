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
    queue: { path: "/o/:orgId/queue", build: (orgId: string) => `/o/${orgId}/queue` },
    batches: { path: "/o/:orgId/batches", build: (orgId: string) => `/o/${orgId}/batches` },
    taggers: { path: "/o/:orgId/taggers", build: (orgId: string) => `/o/${orgId}/taggers` },
    members: { path: "/o/:orgId/members", build: (orgId: string) => `/o/${orgId}/members` },
    audit: { path: "/o/:orgId/audit", build: (orgId: string) => `/o/${orgId}/audit` },
    billing: { path: "/o/:orgId/billing", build: (orgId: string) => `/o/${orgId}/billing` },
    settings: { path: "/o/:orgId/settings", build: (orgId: string) => `/o/${orgId}/settings` },
  },
} as const;
