import { type AssignmentView, assignmentStateStates, countOf } from "@tagloom/contracts";
import { type ReactNode, useCallback, useEffect, useRef, useState } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/card";
import { DueDate } from "@/components/ui/due-date";
import { StateBadge } from "@/components/ui/state-badge";
import { ApiError } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { saveAssignment } from "../api/save-assignment";
import { useSubmitAssignment } from "../api/submit-assignment";
import { useSpansVersion, useUiVersion } from "../hooks/use-store";
import { AnnotationStore } from "../lib/annotation-store";
import { Autosaver } from "../lib/autosaver";
import { buildDocIndex } from "../lib/doc-index";
import { ConflictNotice } from "./conflict-notice";
import { DocumentText, type DocumentTextHandle, type MenuRequest } from "./document-text";
import { HelpDialog } from "./help-dialog";
import { KeysCard } from "./keys-card";
import { SaveStatusBadge } from "./save-status";
import { SchemaPanel } from "./schema-panel";
import { SpanMenu } from "./span-menu";
import { SuggestionsPanel } from "./suggestions-panel";
import { UserText } from "@/components/ui/user-text";

type Props = {
  orgId: string;
  view: AssignmentView;
  /** Where "back" goes (the queue), and what to show after submitting (e.g. a link to the next document). */
  backLink: ReactNode;
  afterSubmit: ReactNode;
};

function createStore(view: AssignmentView): AnnotationStore {
  return new AnnotationStore(
    buildDocIndex(view.document.text, view.document.tokens),
    view.entityTypes,
    { spans: view.spans, dismissed: view.dismissedSuggestions },
    view.suggestions,
    !view.canEdit,
  );
}

/**
 * The annotation workspace: the text with its spans and suggestions, the entity schema with keys
 * and guidelines, autosave with its state, undo and redo, and submit.
 */
export function Workspace({ orgId, view, backLink, afterSubmit }: Props) {
  const [store] = useState(() => createStore(view));
  const [saver, setSaver] = useState<Autosaver | null>(null);
  const [state, setState] = useState(view.state);
  const textRef = useRef<DocumentTextHandle>(null);
  const [menu, setMenu] = useState<MenuRequest | null>(null);
  const [help, setHelp] = useState(false);
  const [guideline, setGuideline] = useState<string | null>(null);
  const [confirming, setConfirming] = useState(false);
  const [submitError, setSubmitError] = useState<string | null>(null);
  const submit = useSubmitAssignment(orgId, view.corpusId, view.id);

  useEffect(() => {
    if (!view.canEdit) return;
    const s = new Autosaver({
      store,
      version: view.version,
      save: (body) => saveAssignment(orgId, view.corpusId, view.id, body),
      onStateChange: setState,
    });
    setSaver(s);
    return () => s.dispose();
  }, [store, orgId, view]);

  useEffect(() => {
    const warn = (e: BeforeUnloadEvent) => {
      if (saver?.dirty) e.preventDefault();
    };
    window.addEventListener("beforeunload", warn);
    return () => window.removeEventListener("beforeunload", warn);
  }, [saver]);

  useEffect(() => {
    textRef.current?.focus();
  }, []);

  const closeMenu = useCallback(() => {
    setMenu(null);
    textRef.current?.focus();
  }, []);
  const closeHelp = useCallback(() => {
    setHelp(false);
    textRef.current?.focus();
  }, []);

  const doSubmit = async () => {
    if (!saver) return;
    setSubmitError(null);
    try {
      await saver.flush();
      const res = await submit.mutateAsync(saver.version);
      saver.version = res.version;
      store.setReadOnly(true);
      setState(res.state);
      setConfirming(false);
    } catch (err) {
      setSubmitError(err instanceof ApiError || err instanceof Error ? err.message : "Could not submit.");
    }
  };

  const readOnly = !view.canEdit || state === "submitted" || state === "accepted";
  return (
    // Side by side from 768 px; on a phone the text comes first at most of the screen's height and the panels follow below it.
    <div className="-mx-2 flex flex-col gap-3 md:h-[calc(100vh-8.5rem)] md:min-h-[520px] lg:-mx-4">
      <header className="flex flex-wrap items-center gap-x-6 gap-y-2">
        <div className="min-w-0">
          <div className="text-xs text-ink-500">{backLink}</div>
          <h1 className="truncate text-xl font-semibold text-ink-900"><UserText>{view.document.title}</UserText></h1>
          <p className="text-xs text-ink-500">
            Batch <UserText>{view.batch.name}</UserText> · {view.batch.dueDate ? <DueDate day={view.batch.dueDate} /> : "no due date"} · <UserText>{view.annotator.name}</UserText>{" "}
            <StateBadge state={assignmentStateStates[state]} className="ml-1" />
          </p>
        </div>
        <div className="ml-auto flex flex-wrap items-center gap-3">
          <SaveStatusBadge saver={view.canEdit ? saver : null} state={state} savedBefore={view.version > 0 ? view.updatedAt : null} />
          <UndoRedo store={store} onDone={() => textRef.current?.focus()} />
          {!readOnly ? (
            confirming ? (
              <span className="flex items-center gap-2 rounded-md border border-ink-200 bg-white px-2 py-1 text-sm">
                Submit for review? You cannot change it afterwards.
                <Button size="sm" busy={submit.isPending} onClick={() => void doSubmit()}>
                  Submit
                </Button>
                <Button size="sm" variant="ghost" onClick={() => setConfirming(false)}>
                  Cancel
                </Button>
              </span>
            ) : (
              <Button onClick={() => setConfirming(true)}>Submit for review</Button>
            )
          ) : null}
        </div>
      </header>
      {state === "returned" && view.reviewComment ? (
        <Notice tone="warn">
          <strong>Sent back by the reviewer:</strong> {view.reviewComment}
        </Notice>
      ) : null}
      {state === "submitted" && view.canEdit ? (
        <Notice tone="info">
          Submitted for review. It is read-only now. {afterSubmit}
        </Notice>
      ) : null}
      {submitError ? <Notice tone="error">{submitError}</Notice> : null}
      <ConflictNotice store={store} saver={saver} />
      <StoreMessage store={store} />
      <div className="flex min-h-0 flex-1 flex-col gap-4 md:flex-row">
        {/* On a phone the text box is as tall as its text, up to 70 % of the screen (then it scrolls). */}
        <div className="min-w-0 *:max-h-[70vh] *:min-h-40 md:h-auto md:flex-1 md:*:max-h-none md:*:min-h-0">
          <DocumentText
            ref={textRef}
            store={store}
            onMenu={setMenu}
            onHelp={() => setHelp(true)}
            onGuideline={(name) => setGuideline((g) => (g === name ? null : name))}
          />
        </div>
        <aside aria-label="Schema, keys and suggestions" className="flex w-full shrink-0 flex-col gap-3 pb-2 md:w-80 md:overflow-y-auto">
          <SchemaPanel store={store} openGuideline={guideline} onGuideline={setGuideline} />
          <SuggestionsPanel store={store} onJump={() => textRef.current?.showCursor()} />
          <KeysCard />
          <SaveLegend store={store} />
        </aside>
      </div>
      {menu ? <SpanMenu store={store} request={menu} onClose={closeMenu} /> : null}
      {help ? <HelpDialog store={store} onClose={closeHelp} /> : null}
    </div>
  );
}

function UndoRedo({ store, onDone }: { store: AnnotationStore; onDone: () => void }) {
  useSpansVersion(store);
  return (
    <span className="flex gap-1">
      <Button size="sm" variant="secondary" disabled={!store.canUndo || store.readOnly} onClick={() => {
          store.undo();
          onDone();
        }} title="Undo (Ctrl+Z)">
        Undo
      </Button>
      <Button size="sm" variant="secondary" disabled={!store.canRedo || store.readOnly} onClick={() => {
          store.redo();
          onDone();
        }} title="Redo (Ctrl+Shift+Z)">
        Redo
      </Button>
    </span>
  );
}

/** The store's last word on what a key did or why it was refused. */
function StoreMessage({ store }: { store: AnnotationStore }) {
  useUiVersion(store);
  const m = store.message;
  return (
    <p role="status" aria-live="polite" className={cn("min-h-5 text-sm", m?.tone === "warn" ? "font-medium text-rust-500" : "text-ink-500")}>
      {m?.text ?? ""}
    </p>
  );
}

function SaveLegend({ store }: { store: AnnotationStore }) {
  useSpansVersion(store);
  return (
    <p className="px-1 text-xs text-ink-500">
      {countOf(store.spans.length, "span")} · {countOf(store.doc.tokenCount, "word")} · saved automatically a moment after each change.
    </p>
  );
}
