import { type EntityType, type SuggestedSpan, annotationStatusLabels, can, countOf, splitLabels } from "@tagloom/contracts";
import { useState } from "react";
import { SpanMark, UNKNOWN_TYPE_COLOR, excerptBounds, useSpanStyles } from "@/components/spans";
import { Link, useNavigate, useParams } from "react-router";
import { Button } from "@/components/ui/button";
import { Notice, PageHeader, Skeleton } from "@/components/ui/card";
import { Dialog } from "@/components/ui/dialog";
import { useToast } from "@/components/ui/toaster";
import { paths } from "@/config/paths";
import { useCorpus } from "@/features/corpora/api/get-corpus";
import { useEntityTypes } from "@/features/corpora/api/get-entity-types";
import { TypeChip } from "@/features/corpora/components/entity-schema-editor";
import { useDeleteDocument } from "@/features/documents/api/delete-document";
import { useDocument } from "@/features/documents/api/get-document";
import { DocumentText } from "@/features/documents/components/document-text";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { NotFoundRoute } from "./not-found";
import { RequireAbility } from "@/components/layout/not-allowed";

/** One document, read-only: its text with gold spans in their types' colours, and its suggestions. */
export function DocumentRoute() {
  return (
    <RequireAbility ability="viewCorpusData" what="A document with its gold spans is for managers and data leads; annotators see the documents of their own assignments.">
      <DocumentScreen />
    </RequireAbility>
  );
}

function DocumentScreen() {
  const org = useCurrentOrg();
  const { corpusId = "", documentId = "" } = useParams();
  const orgId = org.organizationId;
  const corpus = useCorpus(orgId, corpusId);
  const doc = useDocument(orgId, corpusId, documentId);
  const types = useEntityTypes(orgId, corpusId);
  const remove = useDeleteDocument(orgId, corpusId);
  const navigate = useNavigate();
  const toast = useToast();
  const [confirming, setConfirming] = useState(false);
  if (doc.isPending || types.isPending) return <Skeleton />;
  if (doc.isError) return "status" in doc.error && doc.error.status === 404 ? <NotFoundRoute /> : <Notice tone="error">{doc.error.message}</Notice>;
  if (types.isError) return <Notice tone="error">{types.error.message}</Notice>;
  const d = doc.data;
  const used = types.data.filter((t) => d.gold.some((s) => s.type === t.name));
  return (
    <div className="max-w-4xl space-y-5">
      <p className="text-sm">
        <Link to={paths.org.corpus.build(orgId, corpusId)} className="text-ink-500 hover:underline">
          {corpus.data?.name ?? "Corpus"}
        </Link>
      </p>
      <PageHeader
        title={d.title}
        subtitle={`${d.filename ?? "no file"} · ${countOf(d.tokenCount, "token")} in ${countOf(d.sentenceCount, "sentence")} · ${d.split ? `${splitLabels[d.split]} split` : "no split"} · ${annotationStatusLabels[d.annotationStatus]}`}
        actions={
          can(org.role, "manageCorpora") ? (
            <Button variant="ghost" className="text-rust-500" onClick={() => setConfirming(true)}>
              Delete document…
            </Button>
          ) : null
        }
      />
      <div className="flex flex-wrap items-center gap-2 text-sm text-ink-500">
        {d.gold.length ? (
          <>
            <span>{countOf(d.gold.length, "gold span")}:</span>
            {used.map((t) => (
              <TypeChip key={t.id} type={t} />
            ))}
          </>
        ) : (
          <span>No gold spans yet.</span>
        )}
      </div>
      <DocumentText text={d.text} spans={d.gold} types={types.data} />
      {d.suggestions.length ? (
        <section className="space-y-2">
          <h2 className="font-semibold text-ink-900">Suggestions</h2>
          <p className="text-sm text-ink-500">Proposed by an import or a tagger; not authoritative until an annotator accepts them.</p>
          <SuggestionList text={d.text} suggestions={d.suggestions} types={types.data} />
        </section>
      ) : null}
      <Dialog open={confirming} title="Delete this document?" onClose={() => setConfirming(false)}>
        <p className="mb-4 text-sm text-ink-700">Its text, tokens and spans are deleted for good. The deletion is kept in the audit log.</p>
        <div className="flex gap-2">
          <Button
            variant="danger"
            busy={remove.isPending}
            onClick={() =>
              remove.mutate(documentId, {
                onSuccess: () => {
                  toast.show(`${d.title} deleted.`, "success");
                  navigate(paths.org.corpus.build(orgId, corpusId), { replace: true });
                },
              })
            }
          >
            Delete for good
          </Button>
          <Button variant="secondary" onClick={() => setConfirming(false)}>
            Keep it
          </Button>
        </div>
      </Dialog>
    </div>
  );
}

/** The document's suggestions, each in the shared span look (dashed bracket, code and confidence) with a little text either side. */
function SuggestionList({ text, suggestions, types }: { text: string; suggestions: readonly SuggestedSpan[]; types: readonly Pick<EntityType, "name" | "color">[] }) {
  const { colors, codes } = useSpanStyles(types);
  return (
    <ul className="divide-y divide-ink-50 rounded-lg border border-ink-100 bg-white text-sm" data-testid="document-suggestions">
      {suggestions.map((s, i) => {
        const { from, to } = excerptBounds(text, s.start, s.end, 30);
        return (
          <li key={i} className="px-4 py-2 font-serif leading-[2.3] break-words text-ink-700">
            {from > 0 ? "…" : null}
            {text.slice(from, s.start)}
            <SpanMark type={s.type} code={codes.get(s.type) ?? s.type.slice(0, 4).toUpperCase()} color={colors.get(s.type) ?? UNKNOWN_TYPE_COLOR} suggestion={{ confidence: s.confidence }}>
              {text.slice(s.start, s.end)}
            </SpanMark>
            {text.slice(s.end, to)}
            {to < text.length ? "…" : null}
          </li>
        );
      })}
    </ul>
  );
}
