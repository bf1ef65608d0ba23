import { type ComparisonDocument, countOf } from "@tagloom/contracts";
import { SpanText, TypeKey } from "@/components/spans";
import { Card } from "@/components/ui/card";
import { UserText } from "@/components/ui/user-text";

/**
 * One test document read three times: gold, then tagger A, then tagger B, each drawn with the
 * product's span look, with a key naming every type (so colour is never the only cue).
 */
export function ComparisonDocumentView({ doc, labelA, labelB }: { doc: ComparisonDocument; labelA: string; labelB: string }) {
  const rows = [
    { key: "gold", title: "Gold", spans: doc.gold },
    { key: "a", title: `A: ${labelA}`, spans: doc.a },
    { key: "b", title: `B: ${labelB}`, spans: doc.b },
  ];
  return (
    <div className="space-y-4">
      <h2 className="text-lg font-semibold text-ink-900"><UserText>{doc.document.title}</UserText></h2>
      <div aria-label="Key" role="group" className="flex flex-wrap items-center gap-3">
        <span className="text-sm text-ink-500">Key:</span>
        {doc.entityTypes.map((t) => (
          <TypeKey key={t.name} type={t} />
        ))}
      </div>
      {rows.map((r) => (
        <Card key={r.key}>
          <section aria-label={r.title}>
            <h3 className="mb-2 text-sm font-semibold text-ink-700">
              {r.title} <span className="font-normal text-ink-500">({countOf(r.spans.length, "span")})</span>
            </h3>
            <p>
              <SpanText text={doc.document.text} spans={r.spans} types={doc.entityTypes} className="leading-9 text-ink-900" />
            </p>
          </section>
        </Card>
      ))}
    </div>
  );
}
