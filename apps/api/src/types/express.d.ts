import type { Role } from "@tagloom/contracts";

declare global {
  namespace Express {
    interface Request {
      /** The signed-in user and session, set by the session middleware. */
      auth?: { userId: string; email: string; name: string; sessionId: string } | null;
      /** The signed-in user's membership in the organization of the URL (org routes only). */
      /** The API token of a /api/v1 request, set by the bearer-token middleware. */
      apiToken?: { id: string; organizationId: string; name: string };
      member?: { organizationId: string; userId: string; role: Role; email: string; name: string };
    }
  }
}
export {};
