import { annotationStatusStates, assignmentStateStates, batchStateOf, batchStateStates, countOf, fileStateStates } from "@tagloom/contracts";
import { render, screen } from "@testing-library/react";
import { describe, expect, it } from "vitest";
import { renderWithProviders } from "@/testing/test-utils";
import { AnnotatorProgress } from "@/features/batches/components/batch-progress";
import { QueueTable } from "@/features/queue/components/queue-table";
import { StateBadge } from "./state-badge";

describe("state labels come from one table in the contracts", () => {
  it("a badge shows the contract's label, a hint and a mark besides colour", () => {
    render(<StateBadge state={assignmentStateStates.open} />);
    const badge = screen.getByText("Not started").parentElement!;
    expect(badge).toHaveAttribute("title", assignmentStateStates.open.hint);
    expect(badge.querySelector("[aria-hidden]")?.textContent).toBeTruthy();
  });

  it("the queue and the batch page use the same words for the same state", () => {
    const at = "2030-01-01T00:00:00Z";
    renderWithProviders(
      <QueueTable
        items={[{ assignmentId: "a1", corpusId: "c", corpusName: "Ledger notes", batchId: "b", batchName: "Round one", documentId: "d", documentTitle: "Note 1", tokenCount: 12, dueDate: null, state: "open", reviewComment: null, updatedAt: at } as never]}
        linkTo={() => "/x"}
      />,
    );
    expect(screen.getByText(assignmentStateStates.open.label)).toBeInTheDocument();
    renderWithProviders(
      <AnnotatorProgress
        batch={{ annotators: [{ userId: "u", name: "Wren Tallis", email: "w@example.test", assignments: { total: 1, open: 1, in_progress: 0, submitted: 0, accepted: 0, returned: 0 } }] } as never}
      />,
    );
    expect(screen.getByRole("columnheader", { name: assignmentStateStates.open.label })).toBeInTheDocument();
  });

  it("no two states of one kind share a label, and a document in a batch is not called in progress", () => {
    for (const table of [annotationStatusStates, assignmentStateStates, fileStateStates, batchStateStates]) {
      const labels = Object.values(table).map((s) => s.label);
      expect(new Set(labels).size).toBe(labels.length);
    }
    expect(annotationStatusStates.in_progress.label).not.toBe(assignmentStateStates.in_progress.label);
  });

  it("a batch's state follows its assignments", () => {
    const c = (o: Partial<Record<"open" | "in_progress" | "submitted" | "accepted" | "returned", number>>) => {
      const counts = { open: 0, in_progress: 0, submitted: 0, accepted: 0, returned: 0, ...o };
      return { ...counts, total: Object.values(counts).reduce((a, b) => a + b, 0) };
    };
    expect(batchStateOf(c({ open: 4 }))).toBe("not_started");
    expect(batchStateOf(c({ open: 3, in_progress: 1 }))).toBe("under_way");
    expect(batchStateOf(c({ submitted: 2, accepted: 2 }))).toBe("to_review");
    expect(batchStateOf(c({ accepted: 4 }))).toBe("done");
    expect(batchStateOf(c({ returned: 1, accepted: 3 }))).toBe("under_way");
  });

  it("counts read as people say them", () => {
    expect(countOf(1, "span")).toBe("1 span");
    expect(countOf(0, "file")).toBe("0 files");
    expect(countOf(1204, "document")).toBe("1,204 documents");
    expect(countOf(2, "entity type")).toBe("2 entity types");
  });
});
