import type { ResolvedTrainingConfig, TestSplit } from "@tagloom/contracts";
import { perceptronFeatureLabels, trainingConfigDefaults as d } from "@tagloom/contracts";

const wordClassNames = { none: "none", bikel: "shape classes", extended: "extended shape classes", informal: "shape classes for informal text" } as const;
const semiNames = { none: "no", em: "expected counts (EM)", sample: "sampled tags" } as const;

/** A run's settings as a definition list, each marked when it differs from the engine's default. */
export function ConfigList({ config: c, seed, testSplit }: { config: ResolvedTrainingConfig; seed: number; testSplit: TestSplit }) {
  const rows: Array<[string, string, boolean]> = [
    ["Smoothing λ (start, transition, emission)", `${c.smoothing.start}, ${c.smoothing.transition}, ${c.smoothing.emission}`, c.smoothing.start === d.smoothing.start && c.smoothing.transition === d.smoothing.transition && c.smoothing.emission === d.smoothing.emission],
    ["Model order", String(c.order), c.order === d.order],
    ["Rare-word threshold", String(c.rare), c.rare === d.rare],
    ["Word classes", wordClassNames[c.wordClasses], c.wordClasses === d.wordClasses],
    ["Suffix length", String(c.suffixLength), c.suffixLength === d.suffixLength],
    ["Previous-word conditioning", c.prevWord ? "on" : "off", c.prevWord === d.prevWord],
    ["Context emissions", c.contextEmissions ? "on" : "off", c.contextEmissions === d.contextEmissions],
    [
      "Position buckets (token; sentence)",
      c.positionBuckets.token.length || c.positionBuckets.sentence.length ? `${c.positionBuckets.token.join(", ") || "—"}; ${c.positionBuckets.sentence.join(", ") || "—"} (pull ${c.positionStrength})` : "off",
      c.positionBuckets.token.length === 0 && c.positionBuckets.sentence.length === 0,
    ],
    ["Documents without gold", c.semi === "none" ? semiNames.none : `${semiNames[c.semi]}, ${c.iterations} passes, weight ${c.weight}`, c.semi === d.semi],
    ["Word clusters", c.clusters === 0 ? "off" : `${c.clusters}, learnt with the documents without gold`, c.clusters === d.clusters],
    ["Perceptron passes", c.perceptron === 0 ? "off" : `${c.perceptron}, ${perceptronFeatureLabels[c.perceptronFeatures].toLowerCase()}`, c.perceptron === d.perceptron && (c.perceptron === 0 || c.perceptronFeatures === d.perceptronFeatures)],
    ["Cross-validation", c.crossValidationFolds === null ? "off" : `${c.crossValidationFolds} folds`, c.crossValidationFolds === d.crossValidationFolds],
    ["Test split", testSplit.kind === "corpus" ? "the corpus's test documents" : `random hold-out of ${testSplit.percent} %`, testSplit.kind === "corpus"],
    ["Seed", String(seed), seed === d.seed],
  ];
  return (
    <dl className="grid gap-x-6 gap-y-1.5 text-sm sm:grid-cols-[16rem_1fr]">
      {rows.map(([k, v, isDefault]) => (
        <div key={k} className="contents">
          <dt className="text-ink-500">{k}</dt>
          <dd className="text-ink-900">
            {v} {isDefault ? <span className="text-xs text-ink-400">(default)</span> : <span className="text-xs font-medium text-thread-700">(changed)</span>}
          </dd>
        </div>
      ))}
    </dl>
  );
}
