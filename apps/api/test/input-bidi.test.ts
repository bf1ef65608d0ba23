import type { DocumentListItem } from "@tagloom/contracts";
import { beforeAll, describe, expect, it } from "vitest";
import { uploadAndWait } from "./support/corpora";
import type { SignedIn } from "./support/http";
import { startManagerCorpus } from "./support/manager-corpus";

// U+202E RIGHT-TO-LEFT OVERRIDE and U+2066 LEFT-TO-RIGHT ISOLATE (Unicode Standard Annex #9 §2.2, §2.4).
const RLO = "\u202E";
const LRI = "\u2066";

let admin: SignedIn;
let manager: SignedIn;
let corpusId: string;

beforeAll(async () => {
  ({ admin, manager, corpusId } = await startManagerCorpus("Quillet Name Desk", "Bidi corpus", ["PARTY"]));
});

describe("bidirectional controls in names and titles", () => {
  it("keeps the file name as sent on the file's record and gives documents titles without the controls", async () => {
    const fileName = `invoice${RLO}txt.exe.txt`;
    const lines = [JSON.stringify({ text: "Line one from Dovecote Ledgers.", title: `Memo ${LRI}one${RLO}` }), JSON.stringify({ text: "Line two." })].join("\n");
    const { result } = await uploadAndWait(manager.agent, admin.orgId, corpusId, [
      { name: fileName, content: "Text from Dovecote Ledgers." },
      { name: `memo${RLO}s.jsonl`, content: lines },
    ]);
    expect(result.files.map((f) => f.filename).sort()).toEqual([fileName, `memo${RLO}s.jsonl`].sort());
    const list = await manager.agent.get(`/api/orgs/${admin.orgId}/corpora/${corpusId}/documents?limit=50`);
    const titles = (list.body.items as DocumentListItem[]).map((d) => d.title).sort();
    expect(titles).toEqual(["Memo one", "invoicetxt.exe", "memos line 2"]);
    for (const t of titles) expect(t).not.toMatch(/[\u202A-\u202E\u2066-\u2069]/);
  });
});
