import fs from "node:fs/promises";
import type { Page } from "playwright-core";
import { describe, expect, it } from "vitest";
import { makeDocx } from "../../api/test/support/files/docx";
import { makeEncryptedPdf, makePdf } from "../../api/test/support/files/pdf";
import { useBrowser } from "./support/browser";

const session = useBrowser();

/** Drops files on an element the way a browser does: a drop event carrying a DataTransfer. */
async function dropFiles(page: Page, selector: string, files: Array<{ name: string; content: Buffer }>): Promise<void> {
  const payload = files.map((f) => ({ name: f.name, b64: f.content.toString("base64") }));
  const dataTransfer = await page.evaluateHandle((items) => {
    const dt = new DataTransfer();
    for (const item of items) {
      const bytes = Uint8Array.from(atob(item.b64), (c) => c.charCodeAt(0));
      dt.items.add(new File([bytes], item.name));
    }
    return dt;
  }, payload);
  await page.dispatchEvent(selector, "dragover", { dataTransfer });
  await page.dispatchEvent(selector, "drop", { dataTransfer });
}

async function download(page: Page, linkName: string): Promise<string> {
  const [file] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: linkName, exact: true }).click()]);
  return fs.readFile((await file.path())!, "utf8");
}

describe("corpora, uploads and exports in the browser", () => {
  it("creates a corpus with a schema, drops a mixed set of files, watches them become ready or refused, finds a document by a word, and exports gold data", async () => {
    const stamp = Date.now().toString(36);
    const { page } = await session.newPage();
    await page.goto("/sign-up");
    await page.getByLabel("Your name").fill("Ines Marrow");
    await page.getByLabel("E-mail address", { exact: true }).fill(`ines-${stamp}@example.test`);
    await page.getByLabel("Password").fill("a long enough passphrase");
    await page.getByLabel("Organization name").fill(`Fernhollow Records ${stamp}`);
    await page.getByRole("button", { name: "Create account" }).click();
    await page.waitForURL(/\/o\/[0-9a-f-]+$/);

    // A corpus and its entity schema.
    await page.getByRole("navigation", { name: "Areas" }).getByRole("link", { name: "Corpora" }).click();
    await page.getByLabel("Name", { exact: true }).fill("Harbour contracts");
    await page.getByRole("button", { name: "Create corpus" }).click();
    await page.waitForURL(/\/corpora\/[0-9a-f-]+\/schema$/);
    await page.getByRole("heading", { name: "Harbour contracts" }).waitFor();
    const addType = async (name: string, key: string, guideline: string) => {
      await page.getByLabel("Name", { exact: true }).fill(name);
      await page.getByLabel("Key", { exact: true }).fill(key);
      await page.getByLabel("Guideline (Markdown)").fill(guideline);
      await page.getByRole("button", { name: "Add type" }).click();
      await page.getByRole("list", { name: "Entity types" }).getByTitle(name, { exact: true }).waitFor();
    };
    await addType("PARTY", "p", "People **and** companies that sign.");
    await addType("PLACE", "l", "Towns, harbours, rivers.");
    // The guideline's Markdown is rendered (bold), never as raw markup.
    await page.getByRole("list", { name: "Entity types" }).locator("strong", { hasText: "and" }).waitFor();
    // A bad name is refused inline and nothing is added.
    await page.getByLabel("Name", { exact: true }).fill("9lives");
    await page.getByRole("button", { name: "Add type" }).click();
    await page.getByText(/Use an upper-case identifier/).waitFor();
    expect(await page.getByRole("list", { name: "Entity types" }).getByRole("listitem").count()).toBe(2);

    // A mixed set of files, good and bad, dropped at once.
    await page.getByRole("navigation", { name: "Corpus" }).getByRole("link", { name: "Uploads" }).click();
    await page.getByText("Documents may hold personal data.").waitFor();
    await page.getByTestId("upload-limits").waitFor();
    const gold = [
      { title: "Mooring deal", text: "Ada Brightwater leased a mooring in Lowmere from Quillmark Ltd.", spans: [{ start: 0, end: 15, type: "PARTY" }, { start: 36, end: 43, type: "PLACE" }, { start: 49, end: 63, type: "PARTY" }] },
      { title: "Ferry notice", text: "The ferry to Saltmarsh Point leaves at dawn.", split: "test", spans: [{ start: 13, end: 28, type: "PLACE" }] },
    ];
    const badJsonl = [
      JSON.stringify({ text: "Fine line." }),
      JSON.stringify({ text: "Also fine." }),
      JSON.stringify({ text: "Too short.", spans: [{ start: 0, end: 99, type: "PARTY" }] }),
    ].join("\n");
    await dropFiles(page, "[data-testid=drop-zone]", [
      { name: "survey.txt", content: Buffer.from("The kingfisher survey found nests along the Lowmere banks.") },
      { name: "minutes.pdf", content: makePdf([["Minutes of the harbour board.", "Present: Ada Brightwater."]]) },
      { name: "lease.docx", content: makeDocx(["Lease between Quillmark Ltd. and the harbour trust.", "Signed at Lowmere."]) },
      { name: "gold.jsonl", content: Buffer.from(gold.map((g) => JSON.stringify(g)).join("\n")) },
      { name: "tides.conll", content: Buffer.from("Saltmarsh\tB-PLACE\nPoint\tI-PLACE\nfloods\tO\n.\tO\n") },
      { name: "latin1.txt", content: Buffer.from([0x43, 0x61, 0x66, 0xe9, 0x20, 0x6e, 0x6f, 0x74, 0x65]) },
      { name: "bad.jsonl", content: Buffer.from(badJsonl) },
      { name: "locked.pdf", content: makeEncryptedPdf() },
    ]);
    await page.getByText("8 files chosen").waitFor();
    await page.getByRole("button", { name: "Upload 8 files" }).click();
    const results = page.getByRole("region", { name: "Upload results" });
    await results.getByText("All files read: 5 imported, 3 refused.").waitFor({ timeout: 60_000 });
    await results.getByText(/latin1\.txt is not valid UTF-8: the bytes at offset 3 \(0xE9\)/).waitFor();
    await results.getByText(/bad\.jsonl has 1 problem on 1 line, first on line 3: spans\[0\] \[0, 99\) is outside the text/).waitFor();
    await results.getByText(/locked\.pdf is encrypted with a password/).waitFor();
    // The Files list and the corpus header say the same at that very moment (read without waiting:
    // they refresh together with the results).
    expect(await page.getByRole("tab", { name: /^Imported/ }).textContent()).toBe("Imported (5)");
    expect(await page.getByRole("tab", { name: /^Refused/ }).textContent()).toBe("Refused (3)");
    const counts = (await page.getByTestId("corpus-counts").textContent()) ?? "";
    expect(counts).toMatch(/^6 documents/);
    expect(counts).not.toMatch(/being read/);

    // The Documents table: 6 documents (2 from gold.jsonl, 1 each from the other imported files); find one by a word.
    await page.getByRole("navigation", { name: "Corpus" }).getByRole("link", { name: "Documents" }).click();
    const table = page.getByRole("table", { name: "Documents" });
    await table.getByRole("link", { name: "survey" }).waitFor();
    expect(await table.getByRole("row").count()).toBe(1 + 6);
    await page.getByLabel("Search").fill("kingfisher");
    await table.getByRole("link", { name: "survey" }).waitFor();
    await expect.poll(() => table.getByRole("row").count()).toBe(2);
    // In the PDF's minutes and the first JSONL document.
    await page.getByLabel("Search").fill("Brightwater");
    await expect.poll(() => table.getByRole("row").count()).toBe(1 + 2);
    await page.getByLabel("Search").fill("");
    await page.getByLabel("Annotation status").selectOption("gold");
    await expect.poll(() => table.getByRole("row").count()).toBe(1 + 3);

    // The gold document shows its spans in their types' colours.
    await table.getByRole("link", { name: "Mooring deal" }).click();
    const text = page.getByTestId("document-text");
    await text.waitFor();
    expect(await text.locator("mark[data-type=PARTY]").count()).toBe(2);
    expect(await text.locator("mark[data-type=PLACE]").innerText()).toContain("Lowmere");
    await page.getByRole("link", { name: "Harbour contracts" }).click();

    // Exports of the gold documents, in upload order.
    const jsonl = await download(page, "JSONL");
    const lines = jsonl.trimEnd().split("\n").map((l) => JSON.parse(l));
    expect(lines.map((l) => l.title)).toEqual(["Mooring deal", "Ferry notice", "tides"]);
    expect(lines[0]).toEqual({ title: "Mooring deal", text: gold[0]!.text, spans: gold[0]!.spans });
    const conll = await download(page, "CoNLL");
    expect(conll).toContain("-DOCSTART-\n\nAda\tB-PARTY\nBrightwater\tI-PARTY\nleased\tO\n");
    expect(conll).toContain("-DOCSTART-\n\nSaltmarsh\tB-PLACE\nPoint\tI-PLACE\nfloods\tO\n.\tO\n\n");
    expect((page as Page & { outsideRequests?: string[] }).outsideRequests).toEqual([]);
  });
});
