import {
  passwordResetConfirmSchema,
  passwordResetRequestSchema,
  signInInputSchema,
  signUpInputSchema,
  verifyEmailInputSchema,
} from "@tagloom/contracts";
import { type RequestHandler, Router } from "express";
import { UnauthorizedError } from "@/errors";
import {
  confirmPasswordReset,
  getMe,
  recordSignOut,
  requestPasswordReset,
  resendVerification,
  signIn,
  signUp,
  verifyEmail,
} from "./auth.service";
import { endSession, requireSession, startSession } from "./session.middleware";
import { noBody, noQuery, validate, validated } from "@/security/route-meta";

/** Account routes: /auth/* and /me. `limiter` guards the routes an attacker would hammer. */
export function authRouter(limiter: RequestHandler): Router {
  const r = Router();

  r.post("/auth/sign-up", limiter, validate({ query: noQuery, body: signUpInputSchema }), async (req, res) => {
    const input = validated(req, "body", signUpInputSchema);
    const { userId, organizationId } = await signUp(input, req.ip ?? null);
    await startSession(res, userId, req.auth?.sessionId ?? null);
    res.status(201).json({ ...(await getMe(userId)), organizationId });
  });

  r.post("/auth/sign-in", limiter, validate({ query: noQuery, body: signInInputSchema }), async (req, res) => {
    const input = validated(req, "body", signInInputSchema);
    const user = await signIn(input, req.ip ?? null);
    // A new session id at every sign-in (no fixation of an old cookie).
    await startSession(res, user.id, req.auth?.sessionId ?? null);
    res.json(await getMe(user.id));
  });

  r.post("/auth/sign-out", validate({ query: noQuery, body: noBody }), async (req, res) => {
    if (req.auth) {
      await recordSignOut(req.auth.userId, req.auth.email, req.ip ?? null);
      await endSession(res, req.auth.sessionId);
    }
    res.status(204).end();
  });

  r.post("/auth/password-reset/request", limiter, validate({ query: noQuery, body: passwordResetRequestSchema }), async (req, res) => {
    const { email } = validated(req, "body", passwordResetRequestSchema);
    await requestPasswordReset(email);
    res.status(202).json({ ok: true });
  });

  r.post("/auth/password-reset/confirm", limiter, validate({ query: noQuery, body: passwordResetConfirmSchema }), async (req, res) => {
    const { token, password } = validated(req, "body", passwordResetConfirmSchema);
    await confirmPasswordReset(token, password, req.ip ?? null);
    res.status(204).end();
  });

  r.post("/auth/verify-email", validate({ query: noQuery, body: verifyEmailInputSchema }), async (req, res) => {
    const { token } = validated(req, "body", verifyEmailInputSchema);
    await verifyEmail(token, req.ip ?? null);
    res.status(204).end();
  });

  r.post("/auth/verify-email/resend", limiter, requireSession, validate({ query: noQuery, body: noBody }), async (req, res) => {
    await resendVerification(req.auth!.userId);
    res.status(202).json({ ok: true });
  });

  // Whether anyone is signed in, answered 200 either way: the web app asks on every page load, and
  // a signed-out visitor is not an error (a 401 would be logged by the browser on the sign-in page).
  r.get("/auth/session", validate({ query: noQuery }), async (req, res) => {
    const me = req.auth ? await getMe(req.auth.userId) : null;
    res.json({ me: me ?? null });
  });

  r.get("/me", validate({ query: noQuery }), async (req, res) => {
    if (!req.auth) throw new UnauthorizedError();
    const me = await getMe(req.auth.userId);
    if (!me) throw new UnauthorizedError();
    res.json(me);
  });

  return r;
}
