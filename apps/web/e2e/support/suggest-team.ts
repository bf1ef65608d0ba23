import { ApiClient, type Person, type Team, setUpTeam } from "./annotation-team";
import { waitForEmail } from "./browser";

// Invented harbour reports with PERSON, PLACE and ORG spans, for a tagger the browser tests can
// train through the API. Every name is made up from syllables.
const FIRST = ["Mira", "Tobin", "Orla", "Edda", "Jory", "Ines", "Hale", "Wren", "Tamsin", "Idris", "Pell", "Corin"];
const LAST = ["Quell", "Vale", "Finch", "Rusk", "Ashby", "Marrow", "Brannock", "Odalsby", "Quarrow", "Fenmoor", "Unwin", "Sorrel"];
const PLACES = ["Saltmarsh", "Gullhaven", "Lowmere", "Cindral", "Ostbury", "Larkspur", "Varlmoor", "Pennick"];
const ORGS = ["Ostrandel Freight", "Corran Line", "Quillmark Holdings", "Fernhollow Trust", "Saltmere Works", "Brackenfold Ltd"];
const TEMPLATES = [
  "{PERSON} met {PERSON} at {PLACE} on Tuesday.",
  "{PERSON} of {ORG} signed for the crates in {PLACE}.",
  "{ORG} sent a barge from {PLACE} to {PLACE}.",
  "The harbour was quiet all week.",
  "A letter from {PERSON} reached {ORG} late.",
];

export type ReportLine = { title: string; text: string; spans: Array<{ start: number; end: number; type: string }>; split?: "train" | "test" };

/** A small deterministic generator (a linear congruential one: common practice, from memory). */
function rng(seed: number) {
  let s = seed >>> 0;
  return (n: number) => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s % n;
  };
}

// Names the gold never shows, so that the tagger is unsure about some open reports and not others.
const UNSEEN = { FIRST: ["Brisa", "Osk", "Thule", "Vanya"], LAST: ["Kettleby", "Drossmoor", "Ulvane", "Pyrrick"], PLACES: ["Hask", "Twell Reach"], ORGS: ["Gantry Nine", "Ebbwick Co"] };

/**
 * `count` reports of `sentences` sentences, deterministic for a seed. With `unseen`, report i
 * draws names the gold never shows with probability about i / count.
 */
export function makeReports(count: number, sentences: number, seed: number, title: (i: number) => string, unseen = false): ReportLine[] {
  const next = rng(seed);
  let d = 0;
  const pickFrom = <T>(list: readonly T[], fresh: readonly T[]) => (unseen && next(count) < d ? fresh[next(fresh.length)]! : list[next(list.length)]!);
  const pick = <T>(list: readonly T[]) => list[next(list.length)]!;
  const out: ReportLine[] = [];
  for (d = 0; d < count; d++) {
    let text = "";
    const spans: ReportLine["spans"] = [];
    for (let s = 0; s < sentences; s++) {
      if (text) text += " ";
      for (const part of pick(TEMPLATES).split(/(\{[A-Z]+\})/)) {
        const m = /^\{([A-Z]+)\}$/.exec(part);
        if (!m) {
          text += part;
          continue;
        }
        const type = m[1]!;
        const name =
          type === "PERSON"
            ? `${pickFrom(FIRST, UNSEEN.FIRST)} ${pickFrom(LAST, UNSEEN.LAST)}`
            : type === "PLACE"
              ? pickFrom(PLACES, UNSEEN.PLACES)
              : pickFrom(ORGS, UNSEEN.ORGS);
        spans.push({ start: text.length, end: text.length + name.length, type });
        text += name;
      }
    }
    out.push({ title: title(d), text, spans });
  }
  return out;
}

async function uploadJsonl(team: Team, name: string, lines: ReportLine[], spanMode: "gold" | "suggested"): Promise<void> {
  const form = new FormData();
  form.append("spanMode", spanMode);
  form.append("files", new Blob([lines.map((l) => JSON.stringify(l)).join("\n")], { type: "application/json" }), name);
  await team.api.call("POST", `/orgs/${team.orgId}/corpora/${team.corpusId}/uploads`, undefined, form);
}

/** Invites a member with a role and has them join; returns the person. */
async function join(team: Team, baseUrl: string, mailUrl: string, role: string, name: string, email: string): Promise<Person> {
  await team.api.call("POST", `/orgs/${team.orgId}/invitations`, { email, role });
  const mail = await waitForEmail(mailUrl, email, /invited to/);
  const token = decodeURIComponent(new URL(mail.link).pathname.split("/").pop()!);
  const password = team.manager.password;
  const joined = await new ApiClient(baseUrl).call<{ user: { id: string } }>("POST", "/auth/sign-up", { email, password, name, invitationToken: token });
  return { name, email, password, userId: joined.user.id };
}

export type SuggestTeam = Team & { lead: Person; boss: Person; taggerId: string; open: Record<string, string> };

/**
 * The annotation team plus a data lead and a manager, 40 gold reports (30 train, 10 test) and 12
 * open ones, and a tagger trained on the gold through the API (no cross-validation, for speed).
 */
export async function setUpSuggestTeam(baseUrl: string, mailUrl: string, stamp: string): Promise<SuggestTeam> {
  const team = await setUpTeam(baseUrl, mailUrl, stamp);
  const lead = await join(team, baseUrl, mailUrl, "data_lead", "Sable Norwick", `lead-${stamp}@example.test`);
  const boss = await join(team, baseUrl, mailUrl, "manager", "Ansel Drummock", `boss-${stamp}@example.test`);
  const gold = makeReports(40, 5, 7, (i) => `Gold report ${i + 1}`).map((r, i) => ({ ...r, split: i % 4 === 3 ? ("test" as const) : ("train" as const) }));
  const open = makeReports(12, 5, 91, (i) => `Open report ${i + 1}`, true).map((r) => ({ ...r, spans: [] }));
  await uploadJsonl(team, "gold-reports.jsonl", gold, "gold");
  await uploadJsonl(team, "open-reports.jsonl", open, "suggested");
  const expected = 2 + gold.length + open.length;
  const ids: Record<string, string> = {};
  for (let i = 0; i < 240 && Object.keys(ids).length < expected; i++) {
    const page = await team.api.call<{ items: Array<{ id: string; title: string }> }>("GET", `/orgs/${team.orgId}/corpora/${team.corpusId}/documents?limit=200`);
    for (const d of page.items) ids[d.title] = d.id;
    if (Object.keys(ids).length < expected) await new Promise((r) => setTimeout(r, 250));
  }
  if (Object.keys(ids).length < expected) throw new Error(`only ${Object.keys(ids).length} of ${expected} documents appeared`);
  const run = await team.api.call<{ id: string }>("POST", `/orgs/${team.orgId}/corpora/${team.corpusId}/runs`, { crossValidationFolds: null });
  let taggerId = "";
  for (let i = 0; i < 480 && !taggerId; i++) {
    const r = await team.api.call<{ status: string; taggerId: string | null; error: string | null }>("GET", `/orgs/${team.orgId}/corpora/${team.corpusId}/runs/${run.id}`);
    if (r.status === "succeeded" && r.taggerId) taggerId = r.taggerId;
    else if (r.status === "failed" || r.status === "cancelled") throw new Error(`training ${r.status}: ${r.error}`);
    else await new Promise((res) => setTimeout(res, 250));
  }
  if (!taggerId) throw new Error("training did not finish");
  const openIds = Object.fromEntries(open.map((o) => [o.title, ids[o.title]!]));
  return { ...team, documents: { ...team.documents, ...ids }, lead, boss, taggerId, open: openIds };
}
