import { type PerceptronFeatures, type StartRunInput, perceptronFeatureLabels, perceptronFeatureNames, trainingConfigDefaults as d, trainingConfigInputSchema } from "@tagloom/contracts";
import { type ReactNode, useState } from "react";
import { Button } from "@/components/ui/button";
import { Card, Notice } from "@/components/ui/card";
import { Field, Input, Select } from "@/components/ui/field";
import { ApiError } from "@/lib/api-client";

/** The form's values as typed (numbers stay text until submit, so a half-typed value is kept). */
export type RunFormValues = {
  smoothingStart: string;
  smoothingTransition: string;
  smoothingEmission: string;
  tokenBuckets: string;
  sentenceBuckets: string;
  positionStrength: string;
  rare: string;
  wordClasses: "none" | "bikel" | "extended" | "informal";
  suffixLength: string;
  order: "1" | "2";
  prevWord: boolean;
  contextEmissions: boolean;
  crossValidate: boolean;
  folds: string;
  semi: "none" | "em" | "sample";
  iterations: string;
  weight: string;
  split: "corpus" | "holdout";
  holdoutPercent: string;
  seed: string;
  clusters: string;
  perceptron: string;
  perceptronFeatures: PerceptronFeatures;
};

export const defaultRunFormValues: RunFormValues = {
  smoothingStart: String(d.smoothing.start),
  smoothingTransition: String(d.smoothing.transition),
  smoothingEmission: String(d.smoothing.emission),
  tokenBuckets: d.positionBuckets.token.join(", "),
  sentenceBuckets: d.positionBuckets.sentence.join(", "),
  positionStrength: String(d.positionStrength),
  rare: String(d.rare),
  wordClasses: d.wordClasses,
  suffixLength: String(d.suffixLength),
  order: String(d.order) as "1" | "2",
  prevWord: d.prevWord,
  contextEmissions: d.contextEmissions,
  crossValidate: d.crossValidationFolds !== null,
  folds: String(d.crossValidationFolds ?? 5),
  semi: d.semi,
  iterations: String(d.iterations),
  weight: String(d.weight),
  split: d.testSplit.kind,
  holdoutPercent: "20",
  seed: String(d.seed),
  clusters: String(d.clusters),
  perceptron: String(d.perceptron),
  perceptronFeatures: d.perceptronFeatures,
};

/** Which form field shows the message of each request field (the API's and zod's paths). */
const fieldOfPath: Record<string, keyof RunFormValues> = {
  "smoothing.start": "smoothingStart",
  "smoothing.transition": "smoothingTransition",
  "smoothing.emission": "smoothingEmission",
  "positionBuckets.token": "tokenBuckets",
  "positionBuckets.sentence": "sentenceBuckets",
  positionStrength: "positionStrength",
  rare: "rare",
  wordClasses: "wordClasses",
  suffixLength: "suffixLength",
  order: "order",
  prevWord: "prevWord",
  contextEmissions: "contextEmissions",
  crossValidationFolds: "folds",
  semi: "semi",
  iterations: "iterations",
  weight: "weight",
  testSplit: "split",
  "testSplit.percent": "holdoutPercent",
  seed: "seed",
  clusters: "clusters",
  perceptron: "perceptron",
  perceptronFeatures: "perceptronFeatures",
};

type Errors = Partial<Record<keyof RunFormValues, string>>;

/** Maps a request-field path ("positionBuckets.token.2") to its form field. */
function fieldFor(path: string): keyof RunFormValues | undefined {
  for (let p = path; p; p = p.includes(".") ? p.slice(0, p.lastIndexOf(".")) : "") {
    const f = fieldOfPath[p];
    if (f) return f;
  }
  return undefined;
}

/**
 * The request for the typed values, checked with the shared schema the API uses. Text that is not
 * a number is refused here with the same words the schema uses for a bad number.
 */
export function toRunInput(v: RunFormValues): { input: StartRunInput; errors: null } | { input: null; errors: Errors } {
  const errors: Errors = {};
  const num = (key: keyof RunFormValues): number => {
    const text = String(v[key]).trim();
    const n = text === "" ? Number.NaN : Number(text);
    if (!Number.isFinite(n)) errors[key] = "Enter a number.";
    return n;
  };
  const list = (key: "tokenBuckets" | "sentenceBuckets"): number[] => {
    const parts = v[key].split(/[\s,]+/).filter(Boolean);
    const out = parts.map(Number);
    if (out.some((n) => !Number.isFinite(n))) errors[key] = "Use whole numbers separated by commas, e.g. 1, 2, 4.";
    return out;
  };
  const raw = {
    smoothing: { start: num("smoothingStart"), transition: num("smoothingTransition"), emission: num("smoothingEmission") },
    positionBuckets: { token: list("tokenBuckets"), sentence: list("sentenceBuckets") },
    positionStrength: num("positionStrength"),
    rare: num("rare"),
    wordClasses: v.wordClasses,
    suffixLength: num("suffixLength"),
    order: Number(v.order),
    prevWord: v.prevWord,
    contextEmissions: v.contextEmissions,
    crossValidationFolds: v.crossValidate ? num("folds") : null,
    semi: v.semi,
    iterations: num("iterations"),
    weight: num("weight"),
    testSplit: v.split === "corpus" ? { kind: "corpus" as const } : { kind: "holdout" as const, percent: num("holdoutPercent") },
    seed: num("seed"),
    clusters: num("clusters"),
    perceptron: num("perceptron"),
    perceptronFeatures: v.perceptronFeatures,
  };
  if (Object.keys(errors).length) return { input: null, errors };
  const parsed = trainingConfigInputSchema.safeParse(raw);
  if (parsed.success) return { input: parsed.data, errors: null };
  for (const issue of parsed.error.issues) {
    const f = fieldFor(issue.path.join("."));
    if (f && !errors[f]) errors[f] = issue.message;
  }
  return { input: null, errors };
}

/** The API's 400 field details on the form's fields; the rest as one message. */
export function errorsFromApi(err: unknown): { errors: Errors; message: string | null } {
  if (!(err instanceof ApiError)) return { errors: {}, message: "Something went wrong. Try again." };
  const errors: Errors = {};
  for (const [path, messages] of Object.entries(err.fieldErrors)) {
    const f = fieldFor(path);
    if (f && messages[0]) errors[f] = messages[0];
  }
  return { errors, message: err.status === 400 && Object.keys(errors).length ? null : err.message };
}

const isDefault = (v: RunFormValues, k: keyof RunFormValues) => v[k] === defaultRunFormValues[k];

/**
 * Every setting of a training run. Each starts at the engine's default (the one its own 5-fold
 * cross-validation chose) and says so; a changed value is marked. Checked with the shared schema
 * before it is sent; the API checks again and its field messages land on the same fields.
 */
export function RunForm({ onSubmit, busy }: { onSubmit: (input: StartRunInput) => Promise<{ errors: Errors; message: string | null } | null>; busy: boolean }) {
  const [values, setValues] = useState<RunFormValues>(defaultRunFormValues);
  const [errors, setErrors] = useState<Errors>({});
  const [message, setMessage] = useState<string | null>(null);
  const set = <K extends keyof RunFormValues>(k: K, value: RunFormValues[K]) => setValues((v) => ({ ...v, [k]: value }));

  const hint = (k: keyof RunFormValues, text?: ReactNode) => (
    <>
      {text ? <>{text} </> : null}
      {isDefault(values, k) ? <span className="text-[#3b6b45]">Default.</span> : <span className="font-medium text-thread-700">Changed; default {String(defaultRunFormValues[k]) || "none"}.</span>}
    </>
  );
  const numberField = (k: keyof RunFormValues, label: string, text?: ReactNode, props: { step?: string; inputMode?: "decimal" | "numeric" } = {}) => (
    <Field label={label} error={errors[k]} hint={hint(k, text)}>
      {(id, desc) => (
        <Input id={id} inputMode={props.inputMode ?? "decimal"} aria-describedby={desc} aria-invalid={!!errors[k]} value={String(values[k])} onChange={(e) => set(k, e.target.value as never)} />
      )}
    </Field>
  );
  const check = (k: "prevWord" | "contextEmissions" | "crossValidate", label: string, text: string) => (
    <label className="flex items-start gap-2 text-sm text-ink-800">
      <input type="checkbox" className="mt-1" checked={values[k]} onChange={(e) => set(k, e.target.checked)} />
      <span>
        <span className="font-medium">{label}</span>
        <span className="block text-xs text-ink-500">{hint(k, text)}</span>
      </span>
    </label>
  );

  return (
    <form
      noValidate
      className="space-y-4"
      onSubmit={async (e) => {
        e.preventDefault();
        setMessage(null);
        const result = toRunInput(values);
        if (result.errors) {
          setErrors(result.errors);
          setMessage("Some settings need a change; see the fields marked below.");
          return;
        }
        setErrors({});
        const failed = await onSubmit(result.input);
        if (failed) {
          setErrors(failed.errors);
          setMessage(failed.message ?? "Some settings need a change; see the fields marked below.");
        }
      }}
    >
      {message ? <Notice tone="error">{message}</Notice> : null}
      <Card className="space-y-3">
        <h2 className="font-semibold text-ink-900">Smoothing</h2>
        <p className="text-sm text-ink-500">Add-λ counts added to every outcome of each distribution before estimating it.</p>
        <div className="grid gap-3 sm:grid-cols-3">
          {numberField("smoothingStart", "λ for start states")}
          {numberField("smoothingTransition", "λ for transitions")}
          {numberField("smoothingEmission", "λ for emissions")}
        </div>
      </Card>
      <Card className="space-y-3">
        <h2 className="font-semibold text-ink-900">Model</h2>
        <div className="grid gap-3 sm:grid-cols-3">
          <Field label="Model order" error={errors.order} hint={hint("order", "1: a tag depends on the previous tag; 2: on the previous two.")}>
            {(id, desc) => (
              <Select id={id} aria-describedby={desc} value={values.order} onChange={(e) => set("order", e.target.value as "1" | "2")}>
                <option value="1">1 (previous tag)</option>
                <option value="2">2 (previous two tags)</option>
              </Select>
            )}
          </Field>
          {numberField("rare", "Rare-word threshold", "Words seen this often or less are modelled by their word class.", { inputMode: "numeric" })}
          <Field label="Word classes" error={errors.wordClasses} hint={hint("wordClasses", "How rare and unseen words are grouped.")}>
            {(id, desc) => (
              <Select id={id} aria-describedby={desc} value={values.wordClasses} onChange={(e) => set("wordClasses", e.target.value as RunFormValues["wordClasses"])}>
                <option value="none">None</option>
                <option value="bikel">Shape classes (capitals, digits)</option>
                <option value="extended">Extended shape classes</option>
                <option value="informal">Informal text (handles, tags, links)</option>
              </Select>
            )}
          </Field>
          {numberField("suffixLength", "Suffix length", "Longest word ending used for unseen words; 0 switches it off.", { inputMode: "numeric" })}
        </div>
        <div className="grid gap-3 sm:grid-cols-2">
          {check("prevWord", "Previous-word conditioning", "Transitions also look at the previous word.")}
          {check("contextEmissions", "Context emissions", "Emissions also look at the previous tag or word.")}
        </div>
      </Card>
      <Card className="space-y-3">
        <h2 className="font-semibold text-ink-900">Position-aware transitions</h2>
        <p className="text-sm text-ink-500">Boundaries of position buckets; transitions are learnt per bucket. Leave both empty to switch them off.</p>
        <div className="grid gap-3 sm:grid-cols-3">
          {numberField("tokenBuckets", "Token-position boundaries", "e.g. 1, 2, 4")}
          {numberField("sentenceBuckets", "Sentence-position boundaries", "e.g. 1, 3")}
          {numberField("positionStrength", "Pull toward shared transitions", "Pseudo-counts drawing each bucket toward the position-free transitions.")}
        </div>
      </Card>
      <Card className="space-y-3">
        <h2 className="font-semibold text-ink-900">Documents without gold</h2>
        <div className="grid gap-3 sm:grid-cols-3">
          <Field label="Learn from them" error={errors.semi} hint={hint("semi", "After training on gold, refine on the corpus's documents without gold.")}>
            {(id, desc) => (
              <Select id={id} aria-describedby={desc} value={values.semi} onChange={(e) => set("semi", e.target.value as RunFormValues["semi"])}>
                <option value="none">No</option>
                <option value="em">Yes, expected counts (EM)</option>
                <option value="sample">Yes, sampled tags</option>
              </Select>
            )}
          </Field>
          {numberField("iterations", "Passes", "Passes over the documents without gold.", { inputMode: "numeric" })}
          {numberField("weight", "Weight", "Weight of their counts against the gold counts.")}
        </div>
      </Card>
      <Card className="space-y-3">
        <h2 className="font-semibold text-ink-900">Word clusters and perceptron</h2>
        <p className="text-sm text-ink-500">Both make training slower; a run with either trains all its documents in one piece.</p>
        <div className="grid gap-3 sm:grid-cols-3">
          {numberField("clusters", "Word clusters", "Learnt from this corpus's documents without gold; 0 = off.", { inputMode: "numeric" })}
          {numberField("perceptron", "Perceptron passes", "Passes that reweigh word scores on the gold documents; 0 = off.", { inputMode: "numeric" })}
          <Field label="Perceptron weights" error={errors.perceptronFeatures} hint={hint("perceptronFeatures", "Neighbouring words help most on informal text (chat, tickets, posts).")}>
            {(id, desc) => (
              <Select id={id} aria-describedby={desc} value={values.perceptronFeatures} onChange={(e) => set("perceptronFeatures", e.target.value as PerceptronFeatures)}>
                {perceptronFeatureNames.map((f) => (
                  <option key={f} value={f}>
                    {perceptronFeatureLabels[f]}
                  </option>
                ))}
              </Select>
            )}
          </Field>
        </div>
      </Card>
      <Card className="space-y-3">
        <h2 className="font-semibold text-ink-900">Evaluation</h2>
        <fieldset className="space-y-2">
          <legend className="text-sm font-medium text-ink-800">Test split</legend>
          <label className="flex items-center gap-2 text-sm">
            <input type="radio" name="split" checked={values.split === "corpus"} onChange={() => set("split", "corpus")} />
            The corpus's test documents {values.split === "corpus" ? <span className="text-xs text-[#3b6b45]">Default.</span> : null}
          </label>
          <label className="flex items-center gap-2 text-sm">
            <input type="radio" name="split" checked={values.split === "holdout"} onChange={() => set("split", "holdout")} />A seeded random hold-out of the gold documents
          </label>
          {errors.split ? (
            <p role="alert" className="text-xs font-medium text-rust-500">
              {errors.split}
            </p>
          ) : null}
        </fieldset>
        <div className="grid gap-3 sm:grid-cols-3">
          {values.split === "holdout" ? numberField("holdoutPercent", "Hold out (%)", "Share of gold documents kept for testing.", { inputMode: "numeric" }) : null}
          {numberField("seed", "Seed", "The same seed, settings and documents give the same tagger.", { inputMode: "numeric" })}
        </div>
        <div className="grid gap-3 sm:grid-cols-3">
          {check("crossValidate", "Cross-validate", "k-fold cross-validation over the training documents.")}
          {values.crossValidate ? numberField("folds", "Folds (k)", undefined, { inputMode: "numeric" }) : null}
        </div>
      </Card>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={busy}>
          Start training
        </Button>
        <Button
          type="button"
          variant="ghost"
          onClick={() => {
            setValues(defaultRunFormValues);
            setErrors({});
            setMessage(null);
          }}
        >
          Back to the defaults
        </Button>
      </div>
    </form>
  );
}
