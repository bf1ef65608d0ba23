import type { BatchAgreement, PairAgreement } from "@tagloom/contracts";

const fmt = (x: number) => x.toFixed(2);

/**
 * Agreement of each pair of annotators on the documents both finished: entity-level F1 (same
 * span, same type) and Cohen's kappa on each word's label, as a table and a bar chart.
 */
export function AgreementView({ agreement }: { agreement: BatchAgreement }) {
  if (!agreement.overall) {
    return <p className="text-sm text-ink-500">No document has been finished by two annotators yet. Give documents to two or more annotators to measure agreement.</p>;
  }
  const pairName = (p: PairAgreement) => `${p.annotatorA.name} & ${p.annotatorB.name}`;
  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_auto]">
      <div role="region" aria-label="Agreement per pair of annotators" tabIndex={0} className="overflow-x-auto rounded-lg border border-ink-100 bg-white focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-ink-500">
        <table className="w-full text-sm">
          <caption className="sr-only">Agreement per pair of annotators</caption>
          <thead className="border-b border-ink-100 bg-ink-50/60 text-xs tracking-wide text-ink-500 uppercase">
            <tr>
              <th scope="col" className="px-4 py-2 text-left">Pair</th>
              <th scope="col" className="px-4 py-2 text-right">Documents</th>
              <th scope="col" className="px-4 py-2 text-right">Spans alike</th>
              <th scope="col" className="px-4 py-2 text-right">Only first</th>
              <th scope="col" className="px-4 py-2 text-right">Only second</th>
              <th scope="col" className="px-4 py-2 text-right">Entity F1</th>
              <th scope="col" className="px-4 py-2 text-right">Kappa</th>
            </tr>
          </thead>
          <tbody className="divide-y divide-ink-50">
            {agreement.pairs.map((p) => (
              <tr key={`${p.annotatorA.userId}-${p.annotatorB.userId}`}>
                <th scope="row" className="px-4 py-2 text-left font-medium text-ink-800">{pairName(p)}</th>
                <td className="px-4 py-2 text-right tabular-nums">{p.documents}</td>
                <td className="px-4 py-2 text-right tabular-nums">{p.matched}</td>
                <td className="px-4 py-2 text-right tabular-nums">{p.onlyA}</td>
                <td className="px-4 py-2 text-right tabular-nums">{p.onlyB}</td>
                <td className="px-4 py-2 text-right font-medium tabular-nums">{fmt(p.f1)}</td>
                <td className="px-4 py-2 text-right font-medium tabular-nums">{fmt(p.kappa)}</td>
              </tr>
            ))}
            <tr className="bg-ink-50/50">
              <th scope="row" className="px-4 py-2 text-left font-semibold">All pairs</th>
              <td className="px-4 py-2 text-right tabular-nums">{agreement.overall.documents}</td>
              <td colSpan={3} />
              <td className="px-4 py-2 text-right font-semibold tabular-nums">{fmt(agreement.overall.f1)}</td>
              <td className="px-4 py-2 text-right font-semibold tabular-nums">{fmt(agreement.overall.kappa)}</td>
            </tr>
          </tbody>
        </table>
        <p className="px-4 py-2 text-xs text-ink-500">
          Entity F1 counts a span as agreed only with the same start, end and type. Kappa compares each word's label (begins, inside or outside a span of a type) and
          discounts agreement expected by chance; 1 is perfect, 0 is chance.
        </p>
      </div>
      <AgreementChart pairs={agreement.pairs} label={pairName} />
    </div>
  );
}

/** Bars of F1 and kappa per pair, in plain SVG. */
export function AgreementChart({ pairs, label }: { pairs: PairAgreement[]; label: (p: PairAgreement) => string }) {
  const rowH = 34;
  const left = 150;
  const width = 300;
  const height = pairs.length * rowH + 36;
  const x = (v: number) => left + Math.max(0, Math.min(1, v)) * width;
  return (
    <figure className="space-y-1">
    <svg role="img" aria-label="Agreement per pair: entity F1 and kappa" width={left + width + 50} height={height} className="rounded-lg border border-ink-100 bg-white">
      {[0, 0.25, 0.5, 0.75, 1].map((t) => (
        <g key={t}>
          <line x1={x(t)} x2={x(t)} y1={8} y2={height - 24} stroke="#d9e4ef" />
          <text x={x(t)} y={height - 8} textAnchor="middle" fontSize="10" fill="#3e6590">
            {t}
          </text>
        </g>
      ))}
      {pairs.map((p, i) => {
        const y = 12 + i * rowH;
        return (
          <g key={`${p.annotatorA.userId}-${p.annotatorB.userId}`}>
            <text x={left - 8} y={y + 13} textAnchor="end" fontSize="11" fill="#0f1d30">
              {label(p).length > 22 ? `${label(p).slice(0, 21)}…` : label(p)}
            </text>
            <rect x={left} y={y} width={Math.max(0, x(p.f1) - left)} height={11} fill="#1d3557">
              <title>{`Entity F1 ${fmt(p.f1)}`}</title>
            </rect>
            <rect x={left} y={y + 13} width={Math.max(0, x(p.kappa) - left)} height={11} fill="#f4a259">
              <title>{`Kappa ${fmt(p.kappa)}`}</title>
            </rect>
            <text x={x(p.f1) + 4} y={y + 9} fontSize="10" fill="#1d3557">
              {fmt(p.f1)}
            </text>
            <text x={x(p.kappa) + 4} y={y + 22} fontSize="10" fill="#b8661c">
              {fmt(p.kappa)}
            </text>
          </g>
        );
      })}
    </svg>
      <figcaption className="flex gap-4 text-xs text-ink-500">
        <span className="flex items-center gap-1">
          <span aria-hidden className="inline-block size-2.5 bg-ink-700" /> Entity F1
        </span>
        <span className="flex items-center gap-1">
          <span aria-hidden className="inline-block size-2.5 bg-thread-500" /> Kappa
        </span>
      </figcaption>
    </figure>
  );
}
