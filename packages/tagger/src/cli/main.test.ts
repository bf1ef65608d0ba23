import { spawnSync } from "node:child_process";
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { beforeAll, describe, expect, it } from "vitest";
import { formatTaggedSentences } from "../text/conll";
import { tinyDocuments } from "../testing/tiny-corpus";

const packageDir = fileURLToPath(new URL("../..", import.meta.url));
const tsx = join(packageDir, "node_modules", ".bin", "tsx");
const cli = join(packageDir, "src", "cli.ts");

function run(args: string[], options: { input?: string; cwd?: string } = {}) {
  const result = spawnSync(tsx, [cli, ...args], { encoding: "utf8", input: options.input, cwd: options.cwd ?? packageDir, env: { ...process.env, INIT_CWD: options.cwd ?? packageDir }, timeout: 120_000 });
  return { code: result.status, stdout: result.stdout, stderr: result.stderr };
}

describe("tagger CLI", () => {
  let dir: string;
  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), "tagger-cli-"));
    const docs = tinyDocuments.map((d) => `-DOCSTART- O\n\n${formatTaggedSentences(d.sentences)}`).join("");
    writeFileSync(join(dir, "train.bio"), docs);
    writeFileSync(join(dir, "test.bio"), formatTaggedSentences(tinyDocuments[0].sentences));
    writeFileSync(join(dir, "bad.bio"), "John\tB-PER\nSmith\n\n");
    writeFileSync(join(dir, "badtag.bio"), "John\tB-PER\nruns\tVERB\n");
  });

  it("trains, writes a model, and tags tokens read from a file or stdin", () => {
    const train = run(["train", "--train", "train.bio", "--out", "model.json", "--rare", "0"], { cwd: dir });
    expect(train.stderr).toBe("");
    expect(train.code).toBe(0);
    expect(JSON.parse(readFileSync(join(dir, "model.json"), "utf8")).schemaVersion).toBe(2);
    const tagged = run(["tag", "--model", "model.json", "--input", "test.bio"], { cwd: dir });
    expect(tagged.code).toBe(0);
    const lines = tagged.stdout.split("\n");
    expect(lines.slice(0, 7)).toEqual(["John\tB-PER", "Smith\tI-PER", "lives\tO", "in\tO", "Paris\tB-LOC", ".\tO", ""]);
    const fromStdin = run(["tag", "--model", "model.json"], { cwd: dir, input: "Mary\nvisited\nBerlin\n\nParis\n" });
    expect(fromStdin.stdout).toBe("Mary\tB-PER\nvisited\tO\nBerlin\tB-LOC\n\nParis\tB-LOC\n\n");
  });

  it("tag --json prints one object per sentence in input order with token-index spans", () => {
    const train = run(["train", "--train", "train.bio", "--out", "json-model.json", "--rare", "0"], { cwd: dir });
    expect(train.code).toBe(0);
    const tagged = run(["tag", "--model", "json-model.json", "--json"], { cwd: dir, input: "Mary\nvisited\nBerlin\n\nParis\n" });
    expect(tagged.code).toBe(0);
    const lines = tagged.stdout.trimEnd().split("\n").map((line) => JSON.parse(line));
    expect(lines).toHaveLength(2);
    expect(Object.keys(lines[0])).toEqual(["tokens", "tags", "spans"]);
    expect(lines[0].tokens).toEqual(["Mary", "visited", "Berlin"]);
    expect(lines[0].tags).toEqual(["B-PER", "O", "B-LOC"]);
    expect(lines[0].spans.map((s: { start: number; end: number; type: string }) => [s.start, s.end, s.type])).toEqual([
      [0, 1, "PER"],
      [2, 3, "LOC"],
    ]);
    expect(Object.keys(lines[0].spans[0])).toEqual(["start", "end", "type", "confidence"]);
    for (const s of [...lines[0].spans, ...lines[1].spans]) {
      expect(s.confidence).toBeGreaterThan(0);
      expect(s.confidence).toBeLessThanOrEqual(1);
    }
    expect(lines[1]).toMatchObject({ tokens: ["Paris"], tags: ["B-LOC"] });
  });

  it("evaluate --json prints exactly the documented object", () => {
    const result = run(["evaluate", "--train", "train.bio", "--test", "test.bio", "--json"], { cwd: dir });
    expect(result.code).toBe(0);
    const json = JSON.parse(result.stdout);
    expect(Object.keys(json)).toEqual(["overall", "types", "tokenAccuracy", "tokens", "sentences", "trainSeconds", "tagSeconds", "tagTokensPerSecond"]);
    expect(Object.keys(json.overall)).toEqual(["precision", "recall", "f1"]);
    expect(Object.keys(json.types.PER)).toEqual(["precision", "recall", "f1", "support"]);
    expect(json.tokens).toBe(20);
    expect(json.sentences).toBe(3);
    for (const x of [json.overall.precision, json.overall.recall, json.overall.f1, json.tokenAccuracy]) {
      expect(x).toBeGreaterThanOrEqual(0);
      expect(x).toBeLessThanOrEqual(1);
    }
    const withModel = run(["evaluate", "--model", "model.json", "--test", "test.bio", "--json"], { cwd: dir });
    expect(JSON.parse(withModel.stdout).trainSeconds).toBe(0);
    const folds = run(["evaluate", "--train", "train.bio", "--test", "test.bio", "--json", "--folds", "3"], { cwd: dir });
    expect(JSON.parse(folds.stdout).crossValidation.folds).toHaveLength(3);
  });

  it("reports plain tags with null entity metrics", () => {
    writeFileSync(join(dir, "pos.txt"), "the\tDT\ndog\tNN\nruns\tVBZ\n\na\tDT\ncat\tNN\nsleeps\tVBZ\n");
    const result = run(["evaluate", "--train", "pos.txt", "--test", "pos.txt", "--json"], { cwd: dir });
    const json = JSON.parse(result.stdout);
    expect(json.overall).toBeNull();
    expect(json.types).toBeNull();
    expect(json.tokenAccuracy).toBe(1);
  });

  it("exits 2 with file:line: reason on malformed input and writes nothing to --out", () => {
    const fresh = run(["train", "--train", "bad.bio", "--out", "never.json"], { cwd: dir });
    expect(fresh.code).toBe(2);
    expect(fresh.stderr).toMatch(/^bad\.bio:2: expected at least 2 columns/);
    expect(existsSync(join(dir, "never.json"))).toBe(false);
    writeFileSync(join(dir, "kept.json"), "previous");
    const existing = run(["train", "--train", "train.bio", "--train", "badtag.bio", "--scheme", "iob", "--out", "kept.json"], { cwd: dir });
    expect(existing.code).toBe(2);
    expect(existing.stderr).toMatch(/^badtag\.bio:2: tag "VERB" is not an IOB tag/);
    expect(readFileSync(join(dir, "kept.json"), "utf8")).toBe("previous");
    const missing = run(["evaluate", "--model", "nope.json", "--test", "test.bio"], { cwd: dir });
    expect(missing.code).toBe(2);
    expect(missing.stderr).toMatch(/^nope\.json:1: cannot read file/);
    writeFileSync(join(dir, "broken.json"), '{\n  "format": "tagloom-hmm",\n  oops\n}');
    const broken = run(["tag", "--model", "broken.json"], { cwd: dir, input: "a\n" });
    expect(broken.code).toBe(2);
    expect(broken.stderr).toMatch(/^broken\.json:3: invalid JSON/);
    writeFileSync(join(dir, "future.json"), JSON.stringify({ ...JSON.parse(readFileSync(join(dir, "model.json"), "utf8")), schemaVersion: 3 }));
    const future = run(["tag", "--model", "future.json"], { cwd: dir, input: "a\n" });
    expect(future.code).toBe(2);
    expect(future.stderr).toMatch(/^future\.json:1: .*unsupported schema version 3/);
  });

  it("rejects bad options with usage and exit code 2", () => {
    for (const args of [["train", "--train", "train.bio"], ["frobnicate"], ["train", "--train", "train.bio", "--out", "x.json", "--order", "3"], ["evaluate", "--test", "test.bio"], ["train", "--bogus"]]) {
      const result = run(args, { cwd: dir });
      expect(result.code, args.join(" ")).toBe(2);
      expect(result.stderr, args.join(" ")).toMatch(/usage:|Unknown option/);
    }
  });
});
