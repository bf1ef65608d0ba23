import type { FileProblem } from "@tagloom/contracts";

/** The per-line problems of a refused JSONL or column file, folded away until asked for. */
export function FileProblems({ problems }: { problems: FileProblem[] }) {
  if (problems.length <= 1) return null;
  return (
    <details className="mt-1 text-xs">
      <summary className="cursor-pointer text-ink-500">All {problems.length} problems</summary>
      <ul className="mt-1 max-h-48 space-y-0.5 overflow-y-auto font-mono text-ink-700">
        {problems.map((p, i) => (
          <li key={i}>
            line {p.line}: {p.message}
          </li>
        ))}
      </ul>
    </details>
  );
}
