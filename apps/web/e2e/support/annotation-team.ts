import type { Page } from "playwright-core";
import { waitForEmail } from "./browser";

/** A signed-in HTTP client for setting up data through the API (cookies kept by hand). */
export class ApiClient {
  private cookie = "";
  constructor(readonly baseUrl: string) {}

  async call<T>(method: string, path: string, body?: unknown, form?: FormData): Promise<T> {
    const res = await fetch(`${this.baseUrl}/api${path}`, {
      method,
      headers: { Origin: this.baseUrl, Cookie: this.cookie, ...(body !== undefined ? { "Content-Type": "application/json" } : {}) },
      body: form ?? (body !== undefined ? JSON.stringify(body) : undefined),
    });
    const set = res.headers.getSetCookie().map((c) => c.split(";")[0]!).filter((c) => !c.endsWith("="));
    if (set.length) this.cookie = set.join("; ");
    const text = await res.text();
    if (!res.ok) throw new Error(`${method} ${path} answered ${res.status}: ${text}`);
    return (text ? JSON.parse(text) : undefined) as T;
  }
}

export type Person = { name: string; email: string; password: string; userId: string };
export type Team = {
  orgId: string;
  corpusId: string;
  manager: Person;
  annotators: [Person, Person];
  documents: Record<string, string>;
  api: ApiClient;
};

const PASSWORD = "a long enough passphrase";

export const TEXTS = {
  harbour: "Mira Quell met Tobin Vale at the Saltmarsh depot on Tuesday. Orla Finch signed for Ostrandel Freight.",
  ferry: "Edda Rusk took the ferry from Gullhaven to Lowmere Quay. The Corran Line owns the ferry.",
};

/**
 * A manager (the founding admin) and two annotators who joined by invitation, a corpus with
 * three entity types, and two documents uploaded as JSONL (one with a suggestion).
 */
export async function setUpTeam(baseUrl: string, mailUrl: string, stamp: string): Promise<Team> {
  const api = new ApiClient(baseUrl);
  const manager = { name: "Hale Brannock", email: `manager-${stamp}@example.test`, password: PASSWORD, userId: "" };
  const signUp = await api.call<{ user: { id: string }; organizationId: string }>("POST", "/auth/sign-up", {
    email: manager.email,
    password: PASSWORD,
    name: manager.name,
    organizationName: `Saltmarsh Survey ${stamp}`,
  });
  manager.userId = signUp.user.id;
  const orgId = signUp.organizationId;
  const annotators: Person[] = [];
  for (const [i, name] of ["Ines Marrow", "Jory Ashby"].entries()) {
    const email = `annotator${i + 1}-${stamp}@example.test`;
    await api.call("POST", `/orgs/${orgId}/invitations`, { email, role: "annotator" });
    const mail = await waitForEmail(mailUrl, email, /invited to/);
    const token = decodeURIComponent(new URL(mail.link).pathname.split("/").pop()!);
    const joined = await new ApiClient(baseUrl).call<{ user: { id: string } }>("POST", "/auth/sign-up", { email, password: PASSWORD, name, invitationToken: token });
    annotators.push({ name, email, password: PASSWORD, userId: joined.user.id });
  }
  const corpus = await api.call<{ id: string }>("POST", `/orgs/${orgId}/corpora`, { name: "Harbour reports" });
  const types: Array<[string, string, string]> = [
    ["PERSON", "p", "A person named in the text, first and last name together."],
    ["PLACE", "l", "A named place: town, quay, depot. Include words like Quay or depot when they are part of the name."],
    ["ORG", "o", "A company or other organization."],
  ];
  for (const [name, hotkey, guideline] of types) await api.call("POST", `/orgs/${orgId}/corpora/${corpus.id}/entity-types`, { name, hotkey, guideline });
  const lines = [
    { title: "Harbour log", text: TEXTS.harbour, spans: [{ ...at(TEXTS.harbour, "Orla Finch"), type: "PERSON", confidence: 0.93 }] },
    { title: "Ferry notes", text: TEXTS.ferry, spans: [] },
  ];
  const form = new FormData();
  form.append("spanMode", "suggested");
  form.append("files", new Blob([lines.map((l) => JSON.stringify(l)).join("\n")], { type: "application/json" }), "reports.jsonl");
  await api.call("POST", `/orgs/${orgId}/corpora/${corpus.id}/uploads`, undefined, form);
  const documents: Record<string, string> = {};
  for (let i = 0; i < 120 && Object.keys(documents).length < 2; i++) {
    const page = await api.call<{ items: Array<{ id: string; title: string }> }>("GET", `/orgs/${orgId}/corpora/${corpus.id}/documents`);
    for (const d of page.items) documents[d.title] = d.id;
    if (Object.keys(documents).length < 2) await new Promise((r) => setTimeout(r, 250));
  }
  if (Object.keys(documents).length < 2) throw new Error("the uploaded documents did not appear");
  return { orgId, corpusId: corpus.id, manager, annotators: annotators as [Person, Person], documents, api };
}

/** Signs a person in through the sign-in screen (continuing to `next` when given). */
export async function signIn(page: Page, person: Person, next?: string): Promise<void> {
  await page.goto(next ? `/sign-in?next=${encodeURIComponent(next)}` : "/sign-in");
  await page.getByLabel("E-mail address").fill(person.email);
  await page.getByLabel("Password").fill(person.password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"));
}

/** Waits until the workspace says every change is saved. */
export async function waitSaved(page: Page): Promise<void> {
  await page.locator('[data-save-state="saved"][data-saved-at]').getByText(/^Saved /).waitFor({ timeout: 10_000 });
}

/** Offsets of the first occurrence of a phrase. */
export function at(text: string, phrase: string): { start: number; end: number } {
  const start = text.indexOf(phrase);
  if (start < 0) throw new Error(`"${phrase}" not in text`);
  return { start, end: start + phrase.length };
}
