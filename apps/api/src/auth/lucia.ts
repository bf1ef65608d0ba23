import { NodePostgresAdapter } from "@lucia-auth/adapter-postgresql";
import { Lucia, TimeSpan } from "lucia";
import { env } from "@/config/env";
import { pgPool } from "@/db/pg-pool";

export const lucia = new Lucia(new NodePostgresAdapter(pgPool, { user: "auth_user", session: "user_session" }), {
  sessionExpiresIn: new TimeSpan(30, "d"),
  sessionCookie: {
    name: "tagloom_session",
    attributes: { secure: env.cookieSecure, sameSite: "lax", path: "/" },
  },
  getSessionAttributes: (a) => ({ createdAt: new Date(a.created_at) }),
  getUserAttributes: (a) => ({
    email: a.email,
    name: a.name,
    rotateSessionsBefore: a.rotate_sessions_before ? new Date(a.rotate_sessions_before) : null,
  }),
});

declare module "lucia" {
  interface Register {
    Lucia: typeof lucia;
    DatabaseSessionAttributes: { created_at: Date | string };
    DatabaseUserAttributes: { email: string; name: string; rotate_sessions_before: Date | string | null };
  }
}
