/**
 * The tagger's command line (the only file of the package that does I/O):
 *   pnpm --silent tagger train --train FILE [--train FILE ...] --out MODEL.json [training options]
 *   pnpm --silent tagger tag --model MODEL.json [--input FILE] [--json]
 *   pnpm --silent tagger evaluate --test FILE (--model MODEL.json | --train FILE ... [training options]) [--json] [--folds K]
 *   pnpm --silent tagger bench [--json]
 * Relative paths are resolved against INIT_CWD (the directory pnpm was started from) or the
 * current directory. Malformed input exits with code 2 and `file:line: reason` on stderr; a model
 * is written to --out only after training succeeded (through a temporary file and a rename).
 */
import { readFileSync, renameSync, rmSync, writeFileSync } from "node:fs";
import { isAbsolute, resolve } from "node:path";
import { parseArgs } from "node:util";
import { ColumnFormatError, parseColumnText, type ColumnDocument, type TagScheme } from "../text/conll";
import { crossValidate } from "../evaluation/cross-validation";
import { evaluateModel } from "../evaluation/evaluation";
import { parsePositionBuckets } from "../estimation/position-buckets";
import { loadModel, ModelFormatError, serializeModel } from "../model/serialize";
import { trainTagger, tagDocument, tagSentence } from "../model/tagger";
import type { TaggerModel } from "../model/tagger-model";
import { DEFAULT_TRAINING_CONFIG, type TrainingConfig } from "../estimation/training-config";
import { benchTagging, benchTraining, benchViterbi } from "./bench";
import { selectConfiguration } from "../estimation/select-config";

/** An error the user can fix: printed as is, exit code 2. */
class UsageError extends Error {}

const USAGE = `usage:
  tagger train --train FILE [--train FILE ...] --out MODEL.json [training options]
  tagger tag --model MODEL.json [--input FILE] [--json]
  tagger evaluate --test FILE (--model MODEL.json | --train FILE ... [training options]) [--json] [--folds K]
  tagger bench [--json]
training options:
  --scheme auto|iob|plain        tag scheme (default auto)
  --smoothing λ | start=λ,transition=λ,emission=λ   add-λ constants
  --position-buckets LIST|none   token boundaries "1,2,4" or "token:1,2/sentence:1"
  --position-strength β          pull of each bucket toward the position-free estimate
  --rare N                       words seen ≤ N times are modelled by their word class
  --word-classes none|bikel|extended|informal
  --lowercase-first-word on|off  read an unknown sentence-initial word as its lower-case form
  --suffix-length N              longest suffix for unknown words (0 = off)
  --suffix-theta θ|brants        successive-abstraction weight
  --order 1|2                    first-order or second-order (trigram) transitions
  --prev-word on|off             transitions conditioned on the previous word
  --context-emissions on|off     emissions conditioned on the previous state or word
  --end-state on|off             model sentence ends
  --constrain-iob on|off         forbid invalid IOB2 transitions
  --unlabelled FILE --semi em|sample --iterations N --weight W --seed N
  --clusters N                   N word clusters learned from the training text and any --unlabelled
                                 FILE (tokens one per line, blank line between sentences) refine
                                 unknown and rare words (0 = off, the default)
  --perceptron N                 N passes of the averaged perceptron adding weights to the
                                 emission scores (0 = off, the default; order 1 only)
  --perceptron-features symbol|word-type|neighbours  what the perceptron's weights are on: the
                                 word's symbol (default), features of the word type (lower-cased
                                 form, prefixes and suffixes, shape, word class, clusters; any
                                 order), or those plus the neighbouring words (lower-cased w±1,
                                 w±2, class and shape of w±1, sentence boundaries; any order)
  --calibration platt-length|platt|none  span confidences calibrated on 5-fold CV of the training data (default platt-length: Platt with ln span length)
  --nltk-compatible              NLTK's HMM (γ = --smoothing, default 0.1)
  --select cv|off                choose first-order or trigram by 3-fold CV of the training data
                                 when --order, --prev-word and --context-emissions are unset (default cv)`;

const OPTIONS = {
  train: { type: "string", multiple: true },
  out: { type: "string" },
  model: { type: "string" },
  input: { type: "string" },
  test: { type: "string" },
  json: { type: "boolean" },
  folds: { type: "string" },
  scheme: { type: "string" },
  smoothing: { type: "string" },
  "position-buckets": { type: "string" },
  "position-strength": { type: "string" },
  rare: { type: "string" },
  "word-classes": { type: "string" },
  "lowercase-first-word": { type: "string" },
  "suffix-length": { type: "string" },
  "suffix-theta": { type: "string" },
  order: { type: "string" },
  "prev-word": { type: "string" },
  "context-emissions": { type: "string" },
  "end-state": { type: "string" },
  "constrain-iob": { type: "string" },
  unlabelled: { type: "string", multiple: true },
  semi: { type: "string" },
  iterations: { type: "string" },
  weight: { type: "string" },
  seed: { type: "string" },
  calibration: { type: "string" },
  clusters: { type: "string" },
  perceptron: { type: "string" },
  "perceptron-features": { type: "string" },
  beam: { type: "string" },
  "nltk-compatible": { type: "boolean" },
  select: { type: "string" },
  help: { type: "boolean" },
} as const;

type Values = ReturnType<typeof parseArgs<{ options: typeof OPTIONS; allowPositionals: true }>>["values"];

const baseDirectory = process.env.INIT_CWD ?? process.cwd();
const resolvePath = (file: string) => (isAbsolute(file) ? file : resolve(baseDirectory, file));

function readText(file: string): string {
  try {
    return readFileSync(resolvePath(file), "utf8");
  } catch (error) {
    throw new ColumnFormatError(file, 1, `cannot read file (${(error as NodeJS.ErrnoException).code ?? (error as Error).message})`);
  }
}

function number(name: string, text: string, check: (n: number) => boolean, expected: string): number {
  const n = Number(text);
  if (text.trim() === "" || !Number.isFinite(n) || !check(n)) throw new UsageError(`--${name}: expected ${expected}, got "${text}"`);
  return n;
}

function onOff(name: string, text: string | undefined): boolean | undefined {
  if (text === undefined) return undefined;
  if (text !== "on" && text !== "off") throw new UsageError(`--${name}: expected on or off, got "${text}"`);
  return text === "on";
}

function choice<T extends string>(name: string, text: string | undefined, allowed: readonly T[]): T | undefined {
  if (text === undefined) return undefined;
  if (!allowed.includes(text as T)) throw new UsageError(`--${name}: expected ${allowed.join(", ")}, got "${text}"`);
  return text as T;
}

/** Clustering keeps (m + 2)² numbers per table: 1,000 clusters take about 40 MB. */
const MAX_CLUSTERS = 1000;

/** The training options given on the command line (unset ones keep their defaults). */
function trainingConfig(values: Values): Partial<TrainingConfig> {
  const config: { -readonly [K in keyof TrainingConfig]?: TrainingConfig[K] } = {};
  if (values.scheme !== undefined) config.scheme = choice("scheme", values.scheme, ["auto", "iob", "plain"] as const);
  if (values.smoothing !== undefined) {
    const text = values.smoothing;
    if (!text.includes("=")) {
      const l = number("smoothing", text, (n) => n >= 0, "a number ≥ 0");
      config.smoothing = { start: l, transition: l, emission: l };
    } else {
      const smoothing = { ...DEFAULT_TRAINING_CONFIG.smoothing };
      for (const part of text.split(",")) {
        const [key, value] = part.split("=");
        if (key !== "start" && key !== "transition" && key !== "emission") throw new UsageError(`--smoothing: unknown distribution "${key}" (start, transition, emission)`);
        smoothing[key] = number("smoothing", value ?? "", (n) => n >= 0, "a number ≥ 0");
      }
      config.smoothing = smoothing;
    }
  }
  if (values["position-buckets"] !== undefined) {
    try {
      config.positionBuckets = parsePositionBuckets(values["position-buckets"]);
    } catch (error) {
      throw new UsageError(`--position-buckets: ${(error as Error).message}`);
    }
  }
  if (values["position-strength"] !== undefined) config.positionStrength = number("position-strength", values["position-strength"], (n) => n >= 0, "a number ≥ 0");
  if (values.rare !== undefined) config.rare = number("rare", values.rare, (n) => Number.isInteger(n) && n >= 0, "an integer ≥ 0");
  if (values["word-classes"] !== undefined) config.wordClasses = choice("word-classes", values["word-classes"], ["none", "bikel", "extended", "informal"] as const);
  const lowercaseFirstWord = onOff("lowercase-first-word", values["lowercase-first-word"]);
  if (lowercaseFirstWord !== undefined) config.lowercaseFirstWord = lowercaseFirstWord;
  if (values["suffix-length"] !== undefined) config.suffixLength = number("suffix-length", values["suffix-length"], (n) => Number.isInteger(n) && n >= 0, "an integer ≥ 0");
  if (values["suffix-theta"] !== undefined) {
    config.suffixTheta = values["suffix-theta"] === "brants" ? null : number("suffix-theta", values["suffix-theta"], (n) => n >= 0, "a number ≥ 0 or brants");
  }
  if (values.order !== undefined) config.order = number("order", values.order, (n) => n === 1 || n === 2, "1 or 2") as 1 | 2;
  const prevWord = onOff("prev-word", values["prev-word"]);
  if (prevWord !== undefined) config.prevWord = prevWord;
  const contextEmissions = onOff("context-emissions", values["context-emissions"]);
  if (contextEmissions !== undefined) config.contextEmissions = contextEmissions;
  const endState = onOff("end-state", values["end-state"]);
  if (endState !== undefined) config.endState = endState;
  const constrain = onOff("constrain-iob", values["constrain-iob"]);
  if (constrain !== undefined) config.constrainIob = constrain;
  if (values.semi !== undefined) config.semi = choice("semi", values.semi, ["em", "sample"] as const);
  if (values.iterations !== undefined) config.iterations = number("iterations", values.iterations, (n) => Number.isInteger(n) && n >= 0, "an integer ≥ 0");
  if (values.weight !== undefined) config.weight = number("weight", values.weight, (n) => n >= 0, "a number ≥ 0");
  if (values.seed !== undefined) config.seed = number("seed", values.seed, Number.isInteger, "an integer");
  if (values.beam !== undefined) config.beam = number("beam", values.beam, (n) => n >= 1, "a number ≥ 1");
  if (values.calibration !== undefined) config.calibration = choice("calibration", values.calibration, ["platt", "platt-length", "none"] as const);
  if (values.clusters !== undefined) config.clusters = number("clusters", values.clusters, (n) => Number.isInteger(n) && n >= 0 && n <= MAX_CLUSTERS, `an integer from 0 to ${MAX_CLUSTERS}`);
  if (values.perceptron !== undefined) config.perceptron = number("perceptron", values.perceptron, (n) => Number.isInteger(n) && n >= 0 && n <= 100, "an integer from 0 to 100");
  if (values["perceptron-features"] !== undefined) config.perceptronFeatures = choice("perceptron-features", values["perceptron-features"], ["symbol", "word-type", "neighbours"] as const);
  if (values["nltk-compatible"] === true) config.nltkCompatible = true;
  if (config.semi !== undefined && (values.unlabelled ?? []).length === 0) throw new UsageError("--semi needs --unlabelled FILE");
  if ((values.unlabelled ?? []).length > 0 && config.semi === undefined && !(config.clusters !== undefined && config.clusters > 0)) {
    throw new UsageError("--unlabelled needs --semi em|sample or --clusters N");
  }
  return config;
}

/** Parses labelled files; the scheme is forced when --scheme says so. */
function readLabelled(files: readonly string[], scheme: string | undefined): { documents: ColumnDocument[]; scheme: TagScheme } {
  const documents: ColumnDocument[] = [];
  let detected: TagScheme = "iob";
  for (const file of files) {
    const parsed = parseColumnText(readText(file), { file, scheme: (scheme ?? "auto") as "auto" | "iob" | "plain" });
    documents.push(...parsed.documents);
    if (parsed.scheme === "plain") detected = "plain";
  }
  return { documents, scheme: scheme === "iob" || scheme === "plain" ? scheme : detected };
}

/** Token-only documents (first column; tags optional and ignored). */
function readTokens(file: string, text: string): string[][][] {
  return parseColumnText(text, { file, scheme: "plain", requireTags: false }).documents.map((d) => d.sentences.map((s) => s.words));
}

function readModel(file: string): TaggerModel {
  const text = readText(file);
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    const message = (error as Error).message;
    const position = /position (\d+)/.exec(message);
    const line = position === null ? 1 : text.slice(0, Number(position[1])).split("\n").length;
    throw new ColumnFormatError(file, line, `invalid JSON: ${message}`);
  }
  try {
    return loadModel(json);
  } catch (error) {
    if (error instanceof ModelFormatError || error instanceof RangeError) throw new ColumnFormatError(file, 1, error.message);
    throw error;
  }
}

const seconds = (from: bigint) => Number(process.hrtime.bigint() - from) / 1e9;

/** Trains from --train files with the command line's training options. */
function trainFromArguments(values: Values): { model: TaggerModel; seconds: number; documents: ColumnDocument[] } {
  const files = values.train ?? [];
  if (files.length === 0) throw new UsageError("--train FILE is required");
  const given = trainingConfig(values);
  const select = values.select === undefined ? "cv" : choice("select", values.select, ["cv", "off"] as const);
  const { documents } = readLabelled(files, given.scheme);
  const unlabelled = (values.unlabelled ?? []).flatMap((file) => readTokens(file, readText(file)));
  const started = process.hrtime.bigint();
  const config = select === "cv" ? { ...selectConfiguration(documents, given).chosen.config, ...given } : given;
  const clock = () => Number(process.hrtime.bigint()) / 1e6;
  const { model, history } = trainTagger(documents, config, { unlabelled, now: clock });
  for (const report of history) {
    process.stderr.write(
      `${report.method} iteration ${report.iteration}: log-likelihood ${report.logLikelihood.toFixed(3)}, ${report.seconds?.toFixed(3)} s, ` +
        `${report.statisticsCells} non-zero statistics (${report.statisticsBytes} bytes)\n`,
    );
  }
  return { model, seconds: seconds(started), documents };
}

function commandTrain(values: Values): void {
  if (values.out === undefined) throw new UsageError("--out MODEL.json is required");
  const { model } = trainFromArguments(values);
  const out = resolvePath(values.out);
  const temporary = `${out}.${process.pid}.tmp`;
  try {
    writeFileSync(temporary, JSON.stringify(serializeModel(model)));
    renameSync(temporary, out);
  } catch (error) {
    rmSync(temporary, { force: true });
    throw error;
  }
}

function commandTag(values: Values): void {
  if (values.model === undefined) throw new UsageError("--model MODEL.json is required");
  const model = readModel(values.model);
  const file = values.input ?? "<stdin>";
  const text = values.input === undefined ? readFileSync(0, "utf8") : readText(values.input);
  const documents = readTokens(file, text);
  const out: string[] = [];
  if (values.json === true) {
    // One object per sentence and line, in input order (a stable interface, see the README).
    for (const sentences of documents) {
      sentences.forEach((words, s) => {
        const result = tagSentence(model, words, { sentenceIndex: s });
        const spans = result.chunks.map((c) => ({ start: c.start, end: c.end, type: c.type, confidence: c.confidence }));
        out.push(`${JSON.stringify({ tokens: words, tags: result.tags, spans })}\n`);
      });
    }
    process.stdout.write(out.join(""));
    return;
  }
  for (const sentences of documents) {
    const tags = tagDocument(model, sentences);
    sentences.forEach((words, s) => {
      for (let t = 0; t < words.length; t++) out.push(`${words[t]}\t${tags[s][t]}\n`);
      out.push("\n");
    });
  }
  process.stdout.write(out.join(""));
}

const round = (x: number) => Number(x.toFixed(6));

/** Tokens the warm-up of `evaluate`'s timing tags at least (whole passes over the test text). */
const WARM_UP_TOKENS = 100_000;

/**
 * Makes `evaluate`'s `tagTokensPerSecond` a warm figure, as a long-running tagging service sees it
 * (and as warm figures of other taggers are given), without letting the timed pass profit from
 * having seen the test text: the test sentences are first tagged by shallow copies of the model.
 * Every per-model cache of the tagging path is keyed by the model object, so the copies' caches
 * (per word type: symbol and emission row; per symbol pair: patched step matrices) are dropped
 * with them, and only the compiled code stays warm. Then one unknown token prepares the real
 * model's tables (what loading a model costs, once per model), so the timed pass still computes
 * every word type's emission row of the test text from scratch. Timing after warm-up iterations
 * is common practice for code on a just-in-time compiler (from memory: Georges, Buytaert &
 * Eeckhout 2007, "Statistically rigorous Java performance evaluation", OOPSLA, on steady state).
 */
function warmUpTagging(model: TaggerModel, documents: readonly ColumnDocument[]): void {
  const tokens = documents.reduce((n, d) => n + d.sentences.reduce((m, s) => m + s.words.length, 0), 0);
  if (tokens === 0) return;
  // Whole passes, each with a fresh copy, as the timed pass runs (the same calls in the same order).
  for (let tagged = 0; tagged < WARM_UP_TOKENS; tagged += tokens) evaluateModel({ ...model }, documents, { confidences: true });
  tagSentence(model, ["\u2060"]);
}

function commandEvaluate(values: Values): void {
  if (values.test === undefined) throw new UsageError("--test FILE is required");
  if ((values.model === undefined) === ((values.train ?? []).length === 0)) throw new UsageError("give either --model MODEL.json or --train FILE");
  let model: TaggerModel;
  let trainSeconds = 0;
  let trainingDocuments: ColumnDocument[] = [];
  if (values.model !== undefined) {
    model = readModel(values.model);
  } else {
    const trained = trainFromArguments(values);
    model = trained.model;
    trainSeconds = trained.seconds;
    trainingDocuments = trained.documents;
  }
  const { documents } = readLabelled([values.test], model.scheme === "iob" ? "iob" : "plain");
  warmUpTagging(model, documents);
  const started = process.hrtime.bigint();
  // The whole tagging path (tags and span confidences), as the product runs it.
  const result = evaluateModel(model, documents, { confidences: true });
  const tagSeconds = seconds(started);
  let crossValidation = null;
  if (values.folds !== undefined) {
    const k = number("folds", values.folds, (n) => Number.isInteger(n) && n >= 2, "an integer ≥ 2");
    if (trainingDocuments.length === 0) throw new UsageError("--folds needs --train FILE (cross-validation trains on the training documents)");
    crossValidation = crossValidate(trainingDocuments, trainingConfig(values), k, { confidences: true });
  }
  const e = result.entities;
  const summary = {
    overall: e === null ? null : { precision: round(e.overall.precision), recall: round(e.overall.recall), f1: round(e.overall.f1) },
    types:
      e === null
        ? null
        : Object.fromEntries(Object.entries(e.types).map(([type, v]) => [type, { precision: round(v.precision), recall: round(v.recall), f1: round(v.f1), support: v.support }])),
    tokenAccuracy: round(result.tokenAccuracy),
    tokens: result.tokens,
    sentences: result.sentences,
    trainSeconds: round(trainSeconds),
    tagSeconds: round(tagSeconds),
    tagTokensPerSecond: tagSeconds > 0 ? Math.round(result.tokens / tagSeconds) : 0,
    spanCalibrationError: result.calibration === null ? null : { ece: round(result.calibration.ece), spans: result.calibration.count },
    ...(crossValidation === null ? {} : { crossValidation }),
  };
  if (values.json === true) {
    process.stdout.write(`${JSON.stringify(summary)}\n`);
    return;
  }
  const lines: string[] = [];
  lines.push(`tokens ${summary.tokens}, sentences ${summary.sentences}, token accuracy ${(100 * summary.tokenAccuracy).toFixed(2)}%`);
  if (e !== null) {
    lines.push(`entities: precision ${(100 * e.overall.precision).toFixed(2)}%, recall ${(100 * e.overall.recall).toFixed(2)}%, F1 ${(100 * e.overall.f1).toFixed(2)}`);
    for (const [type, v] of Object.entries(e.types)) {
      lines.push(`  ${type.padEnd(10)} P ${(100 * v.precision).toFixed(2).padStart(6)}  R ${(100 * v.recall).toFixed(2).padStart(6)}  F1 ${(100 * v.f1).toFixed(2).padStart(6)}  support ${v.support}`);
    }
  }
  if (crossValidation !== null) {
    const cv = crossValidation;
    const f1 = cv.f1 === null ? "" : `F1 ${(100 * cv.f1.mean).toFixed(2)} ± ${(100 * cv.f1.std).toFixed(2)}, `;
    lines.push(`${cv.folds.length}-fold cross-validation over ${cv.unit}: ${f1}token accuracy ${(100 * cv.tokenAccuracy.mean).toFixed(2)} ± ${(100 * cv.tokenAccuracy.std).toFixed(2)}`);
  }
  if (summary.spanCalibrationError !== null) {
    const cvEce = crossValidation?.spanCalibrationError;
    lines.push(`span confidence: ECE ${summary.spanCalibrationError.ece.toFixed(4)} over ${summary.spanCalibrationError.spans} spans${cvEce ? `, under cross-validation ${cvEce.ece.toFixed(4)} over ${cvEce.spans}` : ""}`);
  }
  lines.push(`train ${summary.trainSeconds.toFixed(3)} s, tag ${summary.tagSeconds.toFixed(3)} s (${summary.tagTokensPerSecond} tokens/s)`);
  process.stdout.write(`${lines.join("\n")}\n`);
}

function commandBench(values: Values): void {
  const viterbi9 = benchViterbi(9, 2_000_000, 5);
  const viterbi17 = benchViterbi(17, 1_000_000, 5);
  const train = benchTraining(1_000_000, 5);
  const tagging = benchTagging(200_000, 500_000);
  const peakRssBytes = process.resourceUsage().maxRSS * 1024;
  const result = {
    viterbi: { "9": Math.round(viterbi9), "17": Math.round(viterbi17) },
    trainTokensPerSecond: Math.round(train),
    tagTokensPerSecond: Math.round(tagging.tokensPerSecond),
    tagTokensPerCpuSecond: Math.round(tagging.cpuTokensPerSecond),
    peakRssBytes,
  };
  if (values.json === true) process.stdout.write(`${JSON.stringify(result)}\n`);
  else {
    process.stdout.write(
      `Viterbi K=9: ${result.viterbi["9"]} tokens/s\nViterbi K=17: ${result.viterbi["17"]} tokens/s\n` +
        `training (counting encoded sentences): ${result.trainTokensPerSecond} tokens/s\n` +
        `tagging (default configuration, tags and calibrated span confidences): ${result.tagTokensPerSecond} tokens/s (${result.tagTokensPerCpuSecond} per CPU second)\npeak RSS: ${(peakRssBytes / 1048576).toFixed(1)} MB\n`,
    );
  }
}

export function main(argv: readonly string[]): number {
  let parsed;
  try {
    parsed = parseArgs({ args: [...argv], options: OPTIONS, allowPositionals: true, strict: true });
  } catch (error) {
    process.stderr.write(`${(error as Error).message}\n${USAGE}\n`);
    return 2;
  }
  const { values, positionals } = parsed;
  const command = positionals[0];
  if (values.help === true || command === undefined) {
    process.stdout.write(`${USAGE}\n`);
    return command === undefined && values.help !== true ? 2 : 0;
  }
  try {
    if (positionals.length > 1) throw new UsageError(`unexpected argument "${positionals[1]}"`);
    if (command === "train") commandTrain(values);
    else if (command === "tag") commandTag(values);
    else if (command === "evaluate") commandEvaluate(values);
    else if (command === "bench") commandBench(values);
    else throw new UsageError(`unknown command "${command}"`);
    return 0;
  } catch (error) {
    if (error instanceof ColumnFormatError) {
      process.stderr.write(`${error.message}\n`);
      return 2;
    }
    if (error instanceof UsageError) {
      process.stderr.write(`${error.message}\n${USAGE}\n`);
      return 2;
    }
    if (error instanceof RangeError || error instanceof TypeError) {
      process.stderr.write(`error: ${error.message}\n`);
      return 1;
    }
    throw error;
  }
}
