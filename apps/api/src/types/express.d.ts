import type { Role } from "@tagloom/contracts";

declare global {
  namespace Express {
    interface Request {
      /** The signed-in user and session, set by the session middleware. */
      auth?: { userId: string; email: string; name: string; sessionId: string } | null;
      /** The signed-in user's membership in the organization of the URL (org routes only). */
      member?: { organizationId: string; userId: string; role: Role; email: string; name: string };
    }
  }
}
export {};
