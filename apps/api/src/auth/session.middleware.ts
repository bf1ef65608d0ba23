import type { RequestHandler } from "express";
import { lucia } from "@/auth/lucia";
import { UnauthorizedError } from "@/errors";
import { withMeta } from "@/security/route-meta";

/**
 * Reads the session cookie and sets req.auth. A session older than the user's last role change is
 * replaced by a new one (rotation); a session near expiry is extended (lucia's "fresh" flag).
 */
export const sessionMiddleware: RequestHandler = async (req, res, next) => {
  const sessionId = lucia.readSessionCookie(req.headers.cookie ?? "");
  req.auth = null;
  if (!sessionId) return next();
  const { session, user } = await lucia.validateSession(sessionId);
  if (!session) {
    res.append("Set-Cookie", lucia.createBlankSessionCookie().serialize());
    return next();
  }
  let activeId = session.id;
  if (user.rotateSessionsBefore && session.createdAt < user.rotateSessionsBefore) {
    await lucia.invalidateSession(session.id);
    const rotated = await lucia.createSession(user.id, { created_at: new Date() });
    activeId = rotated.id;
    res.append("Set-Cookie", lucia.createSessionCookie(rotated.id).serialize());
  } else if (session.fresh) {
    res.append("Set-Cookie", lucia.createSessionCookie(session.id).serialize());
  }
  req.auth = { userId: user.id, email: user.email, name: user.name, sessionId: activeId };
  next();
};

/** Rejects requests without a signed-in user (401). */
export const requireSession: RequestHandler = withMeta((req, _res, next) => {
  if (!req.auth) throw new UnauthorizedError();
  next();
}, { auth: "session", roles: "signed-in" });

/** Starts a new session for a user and sets its cookie; ends the session the request came with. */
export async function startSession(
  res: import("express").Response,
  userId: string,
  previousSessionId: string | null,
): Promise<void> {
  if (previousSessionId) await lucia.invalidateSession(previousSessionId);
  const session = await lucia.createSession(userId, { created_at: new Date() });
  res.append("Set-Cookie", lucia.createSessionCookie(session.id).serialize());
}

export async function endSession(res: import("express").Response, sessionId: string): Promise<void> {
  await lucia.invalidateSession(sessionId);
  res.append("Set-Cookie", lucia.createBlankSessionCookie().serialize());
}
