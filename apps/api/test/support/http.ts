import type { Server } from "node:http";
import type { AddressInfo } from "node:net";
import type { Me, Role } from "@tagloom/contracts";
import request from "supertest";
import type TestAgent from "supertest/lib/agent";
import { afterAll } from "vitest";
import { type AppOptions, createApp } from "@/app";

export type TestServer = { url: string; agent: () => TestAgent; close: () => Promise<void> };

/** Starts the app on 127.0.0.1:0 for this file (closed after the file's tests). */
export async function startTestServer(options: AppOptions = { authRateLimit: 10_000 }): Promise<TestServer> {
  const app = createApp(options);
  const server: Server = await new Promise((resolve) => {
    const s = app.listen(0, "127.0.0.1", () => resolve(s));
  });
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const close = () =>
    new Promise<void>((resolve) => {
      server.closeAllConnections();
      server.close(() => resolve());
    });
  afterAll(close);
  // A browser on our own page sends its Origin with every state-changing request.
  return { url, agent: () => request.agent(url).set("Origin", url), close };
}

let counter = 0;
/** A unique address for a test user. */
export function uniqueEmail(prefix = "user"): string {
  counter += 1;
  return `${prefix}-${Date.now().toString(36)}-${counter}@example.test`;
}

export const TEST_PASSWORD = "correct horse battery";

export type SignedIn = { agent: TestAgent; userId: string; email: string; orgId: string; me: Me };

/** Signs up a new user who founds a new organization (as its admin). */
export async function signUpFounder(server: TestServer, opts: { email?: string; name?: string; organizationName?: string } = {}): Promise<SignedIn> {
  const agent = server.agent();
  const email = opts.email ?? uniqueEmail("founder");
  const res = await agent
    .post("/api/auth/sign-up")
    .send({ email, password: TEST_PASSWORD, name: opts.name ?? "Founder Person", organizationName: opts.organizationName ?? "Quillmark Studio" });
  if (res.status !== 201) throw new Error(`sign-up failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { agent, userId: res.body.user.id, email, orgId: res.body.organizationId, me: res.body };
}

/**
 * Adds a member with a role to an organization directly through the services (for tests that
 * need many roles quickly), and returns a signed-in agent for them.
 */
export async function addSignedInMember(server: TestServer, orgId: string, role: Role, name = `${role} person`): Promise<SignedIn> {
  const { hashPassword } = await import("@/auth/passwords");
  const { insertUser } = await import("@/auth/users.repository");
  const { addMember } = await import("@/members/members.service");
  const email = uniqueEmail(role.replace("_", "-"));
  const user = await insertUser({ email, name, passwordHash: await hashPassword(TEST_PASSWORD), emailVerified: true });
  await addMember(orgId, user.id, role);
  const agent = server.agent();
  const res = await agent.post("/api/auth/sign-in").send({ email, password: TEST_PASSWORD });
  if (res.status !== 200) throw new Error(`sign-in failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { agent, userId: user.id, email, orgId, me: res.body };
}
