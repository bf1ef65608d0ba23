/**
 * Whole-corpus checks on wikigold (Balasuriya et al. 2009, "Named Entity Recognition in
 * Wikipedia", People's Web Meets NLP workshop; CC BY 4.0), read from ../shared (never copied):
 * a trained model survives serialization with identical predictions, chunk confidences and
 * uncertainty, and the CLI's evaluation agrees with the library's. Accuracy figures are reported
 * by the benchmark (bench/run.ts), not asserted here.
 */
import { spawnSync } from "node:child_process";
import { existsSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { evaluateModel } from "../src/evaluation/evaluation";
import { parseColumnText } from "../src/text/conll";
import { loadModel, serializeModel } from "../src/model/serialize";
import { tagDocument, tagSentence, trainTagger } from "../src/model/tagger";
import { documentUncertainty } from "../src/model/uncertainty";

// The repository's parent holds shared/ (a worktree one level deeper: its grandparent).
const data = ["../../../../shared/data/wikigold/", "../../../../../shared/data/wikigold/"]
  .map((relative) => fileURLToPath(new URL(relative, import.meta.url)))
  .find((directory) => existsSync(join(directory, "train.bio"))) ?? fileURLToPath(new URL("../../../../shared/data/wikigold/", import.meta.url));
const read = (file: string) => parseColumnText(readFileSync(data + file, "utf8"), { file }).documents;

describe("wikigold whole-corpus checks", () => {
  const train = read("train.bio");
  const test = read("test.bio");

  it.each([
    ["default", {}],
    ["second order", { order: 2 as const }],
  ])("a serialized %s model gives identical predictions on the test file", (_name, config) => {
    const { model } = trainTagger(train, config);
    const loaded = loadModel(JSON.parse(JSON.stringify(serializeModel(model))));
    const sentences = test[0].sentences.map((s) => s.words);
    expect(tagDocument(loaded, sentences)).toEqual(tagDocument(model, sentences));
    for (const words of sentences.slice(0, 40)) expect(tagSentence(loaded, words)).toEqual(tagSentence(model, words));
    expect(documentUncertainty(loaded, sentences.slice(0, 40))).toEqual(documentUncertainty(model, sentences.slice(0, 40)));
  });

  it("the CLI's evaluate --json gives the library's scores for the same training and test files", () => {
    const packageDir = fileURLToPath(new URL("..", import.meta.url));
    const run = spawnSync(join(packageDir, "node_modules", ".bin", "tsx"), [join(packageDir, "src", "cli.ts"), "evaluate", "--train", data + "train.bio", "--test", data + "test.bio", "--json"], {
      encoding: "utf8",
      cwd: packageDir,
      env: { ...process.env, INIT_CWD: packageDir },
      timeout: 120_000,
    });
    expect(run.stderr).toBe("");
    expect(run.status).toBe(0);
    const cli = JSON.parse(run.stdout);
    const library = evaluateModel(trainTagger(train).model, test);
    const entities = library.entities!;
    // The CLI rounds its figures to 6 decimals.
    expect(cli.tokens).toBe(library.tokens);
    expect(cli.sentences).toBe(library.sentences);
    expect(cli.tokenAccuracy).toBeCloseTo(library.tokenAccuracy, 6);
    for (const key of ["precision", "recall", "f1"] as const) expect(cli.overall[key], key).toBeCloseTo(entities.overall[key], 6);
    expect(Object.keys(cli.types)).toEqual(Object.keys(entities.types));
    for (const [type, scores] of Object.entries(entities.types)) {
      expect(cli.types[type].support, type).toBe(scores.support);
      for (const key of ["precision", "recall", "f1"] as const) expect(cli.types[type][key], `${type} ${key}`).toBeCloseTo(scores[key], 6);
    }
  });

  it("EM on unlabelled text keeps reporting and round-trips", () => {
    const unlabelled = [test[0].sentences.slice(0, 100).map((s) => s.words)];
    const { model, history } = trainTagger(train, { semi: "em", iterations: 2 }, { unlabelled });
    expect(history.map((r) => r.iteration)).toEqual([1, 2]);
    const loaded = loadModel(JSON.parse(JSON.stringify(serializeModel(model))));
    expect(tagDocument(loaded, unlabelled[0])).toEqual(tagDocument(model, unlabelled[0]));
  });
});
