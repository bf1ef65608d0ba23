import { ApiClient, type Person } from "./annotation-team";
import { waitForEmail } from "./browser";

const PASSWORD = "a long enough passphrase";

// Invented names built from syllables (no real people or places).
const FIRST = ["Mira", "Tobin", "Orla", "Edda", "Wren", "Jory", "Ines", "Hale", "Bram", "Sefa", "Lio", "Nessa"];
const LAST = ["Quell", "Vale", "Finch", "Rusk", "Tallis", "Ashby", "Marrow", "Brannock", "Corrow", "Dunmere"];
const PLACE = ["Saltmarsh", "Gullhaven", "Lowmere", "Ostrandel", "Farrowby", "Kelsind", "Brackwater", "Tarnholt"];
// Names only the test documents use, so the taggers must handle words they never saw.
const FIRST_TEST = ["Kesti", "Ravo", "Ulme", "Dorrin", "Pell"];
const LAST_TEST = ["Vantry", "Oskel", "Hembrow", "Lusk"];
const PLACE_TEST = ["Quillmoor", "Evershold", "Nantby"];
const TEMPLATES: Array<(p: string, q: string, l: string) => string> = [
  (p, q, l) => `${p} met ${q} at ${l} on Tuesday.`,
  (p, q, l) => `The crates from ${l} were signed for by ${p}, and ${q} counted them.`,
  (p, _q, l) => `On the quay at ${l} the harbour master ${p} waited for the ferry.`,
  (p, q, l) => `${q} wrote to ${p} about the tide tables of ${l}.`,
];

/** A small seeded generator (mulberry32, common practice) so the documents are the same every run. */
function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** `count` gold documents of three sentences each, every fourth one in the test split. */
export function goldLines(count: number): string[] {
  const r = rng(7);
  const pick = <T>(xs: T[]) => xs[Math.floor(r() * xs.length)]!;
  const lines: string[] = [];
  for (let i = 0; i < count; i++) {
    let text = "";
    const spans: Array<{ start: number; end: number; type: string }> = [];
    const test = i % 4 === 3;
    for (let s = 0; s < 3; s++) {
      const p = `${pick(test ? FIRST_TEST : FIRST)} ${pick(test ? LAST_TEST : LAST)}`;
      const q = `${pick(FIRST)} ${pick(test ? LAST_TEST : LAST)}`;
      const l = pick(test ? PLACE_TEST : PLACE);
      const sentence = pick(TEMPLATES)(p, q, l);
      const base = text.length + (text ? 1 : 0);
      for (const [name, type] of [[p, "PERSON"], [q, "PERSON"], [l, "PLACE"]] as const) {
        const at = sentence.indexOf(name);
        if (at >= 0 && !spans.some((x) => x.start < base + at + name.length && base + at < x.end)) spans.push({ start: base + at, end: base + at + name.length, type });
      }
      text = text ? `${text} ${sentence}` : sentence;
    }
    lines.push(JSON.stringify({ title: `Quay log ${String(i + 1).padStart(2, "0")}`, text, split: test ? "test" : "train", spans }));
  }
  return lines;
}

export type TrainingTeam = { orgId: string; corpusId: string; dataLead: Person; api: ApiClient };

/** An admin's organization with a data lead (joined by invitation) and a corpus of gold documents. */
export async function setUpTrainingTeam(baseUrl: string, mailUrl: string, stamp: string, documents = 24): Promise<TrainingTeam> {
  const api = new ApiClient(baseUrl);
  const signUp = await api.call<{ organizationId: string }>("POST", "/auth/sign-up", {
    email: `admin-${stamp}@example.test`,
    password: PASSWORD,
    name: "Sefa Corrow",
    organizationName: `Tarnholt Tides ${stamp}`,
  });
  const orgId = signUp.organizationId;
  const email = `lead-${stamp}@example.test`;
  await api.call("POST", `/orgs/${orgId}/invitations`, { email, role: "data_lead" });
  const mail = await waitForEmail(mailUrl, email, /invited to/);
  const token = decodeURIComponent(new URL(mail.link).pathname.split("/").pop()!);
  const joined = await new ApiClient(baseUrl).call<{ user: { id: string } }>("POST", "/auth/sign-up", { email, password: PASSWORD, name: "Nessa Dunmere", invitationToken: token });
  const corpus = await api.call<{ id: string }>("POST", `/orgs/${orgId}/corpora`, { name: "Quay logs" });
  for (const [name, hotkey] of [["PERSON", "p"], ["PLACE", "l"]] as const) await api.call("POST", `/orgs/${orgId}/corpora/${corpus.id}/entity-types`, { name, hotkey, guideline: `A ${name.toLowerCase()} named in the log.` });
  const form = new FormData();
  form.append("spanMode", "gold");
  form.append("files", new Blob([goldLines(documents).join("\n")], { type: "application/json" }), "quay-logs.jsonl");
  await api.call("POST", `/orgs/${orgId}/corpora/${corpus.id}/uploads`, undefined, form);
  for (let i = 0; i < 160; i++) {
    const c = await api.call<{ statuses: { gold: number } }>("GET", `/orgs/${orgId}/corpora/${corpus.id}`);
    if (c.statuses.gold >= documents) break;
    await new Promise((r) => setTimeout(r, 250));
  }
  return { orgId, corpusId: corpus.id, dataLead: { name: "Nessa Dunmere", email, password: PASSWORD, userId: joined.user.id }, api };
}
