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
    writeFileSync(join(dir, "bad.bio"), "Taven\tB-PER\nOrrick\n\n");
    writeFileSync(join(dir, "badtag.bio"), "Taven\tB-PER\nruns\tVERB\n");
  });

  it("trains, writes a model, and tags tokens read from a file or stdin", () => {
    const train = run(["train", "--train", "train.bio", "--out", "model.json", "--rare", "0"], { cwd: dir });
    expect(train.stderr).toBe("");
    expect(train.code).toBe(0);
    expect(JSON.parse(readFileSync(join(dir, "model.json"), "utf8")).schemaVersion).toBe(7);
    const tagged = run(["tag", "--model", "model.json", "--input", "test.bio"], { cwd: dir });
    expect(tagged.code).toBe(0);
    const lines = tagged.stdout.split("\n");
    expect(lines.slice(0, 7)).toEqual(["Taven\tB-PER", "Orrick\tI-PER", "lives\tO", "in\tO", "Velmora\tB-LOC", ".\tO", ""]);
    const fromStdin = run(["tag", "--model", "model.json"], { cwd: dir, input: "Ilsa\nvisited\nKestrane\n\nVelmora\n" });
    expect(fromStdin.stdout).toBe("Ilsa\tB-PER\nvisited\tO\nKestrane\tB-LOC\n\nVelmora\tB-LOC\n\n");
  });

  it("tag --json prints one object per sentence in input order with token-index spans", () => {
    const train = run(["train", "--train", "train.bio", "--out", "json-model.json", "--rare", "0"], { cwd: dir });
    expect(train.code).toBe(0);
    const tagged = run(["tag", "--model", "json-model.json", "--json"], { cwd: dir, input: "Ilsa\nvisited\nKestrane\n\nVelmora\n" });
    expect(tagged.code).toBe(0);
    const lines = tagged.stdout.trimEnd().split("\n").map((line) => JSON.parse(line));
    expect(lines).toHaveLength(2);
    expect(Object.keys(lines[0])).toEqual(["tokens", "tags", "spans"]);
    expect(lines[0].tokens).toEqual(["Ilsa", "visited", "Kestrane"]);
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
    expect(lines[1]).toMatchObject({ tokens: ["Velmora"], tags: ["B-LOC"] });
  });

  it("evaluate --json prints exactly the documented object", () => {
    const result = run(["evaluate", "--train", "train.bio", "--test", "test.bio", "--json"], { cwd: dir });
    expect(result.code).toBe(0);
    const json = JSON.parse(result.stdout);
    expect(Object.keys(json)).toEqual(["overall", "types", "tokenAccuracy", "tokens", "sentences", "trainSeconds", "tagSeconds", "tagTokensPerSecond", "spanCalibrationError"]);
    expect(Object.keys(json.overall)).toEqual(["precision", "recall", "f1"]);
    expect(Object.keys(json.types.PER)).toEqual(["precision", "recall", "f1", "support"]);
    expect(json.tokens).toBe(20);
    expect(json.sentences).toBe(3);
    // The test document is also training data, which the model tags back exactly (the tag test
    // above checks the first sentence): every score is 1.
    expect(json.overall).toEqual({ precision: 1, recall: 1, f1: 1 });
    expect(json.types).toEqual({ LOC: { precision: 1, recall: 1, f1: 1, support: 3 }, ORG: { precision: 1, recall: 1, f1: 1, support: 1 }, PER: { precision: 1, recall: 1, f1: 1, support: 2 } });
    expect(json.tokenAccuracy).toBe(1);
    // Every one of the 6 gold spans is predicted; ECE (10 bins) is a fraction.
    expect(json.spanCalibrationError.spans).toBe(6);
    expect(json.spanCalibrationError.ece).toBeGreaterThanOrEqual(0);
    expect(json.spanCalibrationError.ece).toBeLessThanOrEqual(1);

    // The CLI prints figures rounded to 6 decimals. The same words with two gold tags changed, scored with the saved model, whose tags are still
    // those of training: gold "Quorvel Corp" shrinks to "Quorvel" (B-ORG O) and "1990" becomes
    // B-MISC. Counted by hand (CoNLL convention): gold chunks PER 2, LOC 3, ORG 1, MISC 1 = 7;
    // predicted PER 2, LOC 3, ORG 1 = 6; correct PER 2, LOC 3 = 5 → P = 5/6, R = 5/7,
    // F1 = 2·5/(6 + 7) = 10/13; ORG and MISC 0; tokens differ at "Corp" and "1990" → 18/20.
    const altered = formatTaggedSentences(
      tinyDocuments[0].sentences.map((sentence) => ({
        words: sentence.words,
        tags: sentence.tags.map((tag, t) => (sentence.words[t] === "Corp" ? "O" : sentence.words[t] === "1990" ? "B-MISC" : tag)),
      })),
    );
    writeFileSync(join(dir, "altered.bio"), altered);
    const withModel = run(["evaluate", "--model", "model.json", "--test", "altered.bio", "--json"], { cwd: dir });
    const scored = JSON.parse(withModel.stdout);
    expect(scored.trainSeconds).toBe(0);
    expect(scored.overall.precision).toBeCloseTo(5 / 6, 6);
    expect(scored.overall.recall).toBeCloseTo(5 / 7, 6);
    expect(scored.overall.f1).toBeCloseTo(10 / 13, 6);
    expect(scored.types).toEqual({
      LOC: { precision: 1, recall: 1, f1: 1, support: 3 },
      MISC: { precision: 0, recall: 0, f1: 0, support: 1 },
      ORG: { precision: 0, recall: 0, f1: 0, support: 1 },
      PER: { precision: 1, recall: 1, f1: 1, support: 2 },
    });
    expect(scored.tokenAccuracy).toBeCloseTo(0.9, 6);

    // Cross-validation on three documents whose folds are counted by hand in
    // cross-validation.test.ts: fold F1 1, 6/7, 4/5 → mean 31/35, sample sd √13/35.
    const s = (word: string, tag: string) => `${word}\t${tag}\n\n`;
    const clean = s("w", "B-X").repeat(6) + s("v", "O").repeat(6);
    writeFileSync(join(dir, "cv.bio"), [clean, clean + s("w", "O") + s("v", "B-X"), clean + s("w", "O").repeat(3)].map((d) => `-DOCSTART- O\n\n${d}`).join(""));
    const folds = JSON.parse(run(["evaluate", "--train", "cv.bio", "--test", "cv.bio", "--json", "--folds", "3"], { cwd: dir }).stdout).crossValidation;
    expect(folds.folds.map((f: { f1: number }) => f.f1)).toEqual([1, 6 / 7, 4 / 5].map((x) => expect.closeTo(x, 6)));
    expect(folds.f1.mean).toBeCloseTo(31 / 35, 6);
    expect(folds.f1.std).toBeCloseTo(Math.sqrt(13) / 35, 6);
  });

  it("reports plain tags with null entity metrics", () => {
    writeFileSync(join(dir, "pos.txt"), "the\tDT\ndog\tNN\nruns\tVBZ\n\na\tDT\ncat\tNN\nsleeps\tVBZ\n");
    const result = run(["evaluate", "--train", "pos.txt", "--test", "pos.txt", "--json"], { cwd: dir });
    const json = JSON.parse(result.stdout);
    expect(json.overall).toBeNull();
    expect(json.types).toBeNull();
    expect(json.tokenAccuracy).toBe(1);
    expect(json.spanCalibrationError).toBeNull();
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
    writeFileSync(join(dir, "future.json"), JSON.stringify({ ...JSON.parse(readFileSync(join(dir, "model.json"), "utf8")), schemaVersion: 99 }));
    const future = run(["tag", "--model", "future.json"], { cwd: dir, input: "a\n" });
    expect(future.code).toBe(2);
    expect(future.stderr).toMatch(/^future\.json:1: .*unsupported schema version 99/);
  });

  it("train --clusters N --unlabelled FILE stores clusters of the training and unlabelled words; --perceptron N stores emission weights", () => {
    writeFileSync(join(dir, "unlabelled.txt"), "Nessa\nArvell\nlives\nin\nTirranel\n.\n\nShe\nworks\nfor\nPlumbrix\n.\n");
    const train = run(["train", "--train", "train.bio", "--out", "clusters.json", "--clusters", "4", "--unlabelled", "unlabelled.txt", "--select", "off"], { cwd: dir });
    expect(train.stderr).toBe("");
    expect(train.code).toBe(0);
    const model = JSON.parse(readFileSync(join(dir, "clusters.json"), "utf8"));
    expect(model.config.clusters).toBe(4);
    expect(model.parameters.clusters.words).toEqual(expect.arrayContaining(["Tirranel", "Velmora"]));
    const perceptron = run(["train", "--train", "train.bio", "--out", "perceptron.json", "--perceptron", "2"], { cwd: dir });
    expect(perceptron.code).toBe(0);
    expect(JSON.parse(readFileSync(join(dir, "perceptron.json"), "utf8")).parameters.corrections.length).toBeGreaterThan(0);
    const neighbours = run(["train", "--train", "train.bio", "--out", "neighbours.json", "--perceptron", "2", "--perceptron-features", "neighbours"], { cwd: dir });
    expect(neighbours.code).toBe(0);
    const neighboursModel = JSON.parse(readFileSync(join(dir, "neighbours.json"), "utf8"));
    expect(neighboursModel.config.perceptronFeatures).toBe("neighbours");
    expect(neighboursModel.parameters.neighbourFeatures.names.length).toBeGreaterThan(0);
    const taggedNeighbours = run(["tag", "--model", "neighbours.json", "--json"], { cwd: dir, input: "Nessa\nlives\nin\nTirranel\n" });
    expect(taggedNeighbours.code).toBe(0);
    expect(JSON.parse(taggedNeighbours.stdout.trim()).tokens).toEqual(["Nessa", "lives", "in", "Tirranel"]);
    const tagged = run(["tag", "--model", "clusters.json"], { cwd: dir, input: "Nessa\nlives\nin\nTirranel\n" });
    expect(tagged.code).toBe(0);
    expect(tagged.stdout.split("\n")).toHaveLength(6);
    for (const [args, message] of [
      [["--clusters=-1"], /--clusters: expected an integer from 0 to 1000, got "-1"/],
      [["--clusters", "2.5"], /--clusters: expected an integer/],
      [["--unlabelled", "unlabelled.txt"], /--unlabelled needs --semi em\|sample or --clusters N/],
      [["--clusters", "0", "--unlabelled", "unlabelled.txt"], /--unlabelled needs/],
      [["--perceptron", "many"], /--perceptron: expected an integer from 0 to 100, got "many"/],
      [["--perceptron-features", "context"], /--perceptron-features: expected symbol, word-type, neighbours, got "context"/],
    ] as const) {
      const bad = run(["train", "--train", "train.bio", "--out", "bad-clusters.json", ...args], { cwd: dir });
      expect(bad.code, args.join(" ")).toBe(2);
      expect(bad.stderr).toMatch(message);
      expect(existsSync(join(dir, "bad-clusters.json"))).toBe(false);
    }
  });

  it("rejects bad options with usage and exit code 2", () => {
    for (const args of [["train", "--train", "train.bio"], ["frobnicate"], ["train", "--train", "train.bio", "--out", "x.json", "--order", "3"], ["train", "--train", "train.bio", "--out", "x.json", "--select", "maybe"], ["evaluate", "--test", "test.bio"], ["train", "--bogus"]]) {
      const result = run(args, { cwd: dir });
      expect(result.code, args.join(" ")).toBe(2);
      expect(result.stderr, args.join(" ")).toMatch(/usage:|Unknown option/);
    }
  });
});
