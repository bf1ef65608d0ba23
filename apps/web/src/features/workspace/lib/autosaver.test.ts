import type { SaveAssignmentInput } from "@tagloom/contracts";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { ApiError } from "@/lib/api-client";
import { AnnotationStore } from "./annotation-store";
import { Autosaver } from "./autosaver";
import { buildDocIndex } from "./doc-index";
import { makeTestDoc, testTypes } from "./test-doc";

const text = "Mira Quell met Tobin Vale in Gullhaven .";
const newStore = () => new AnnotationStore(buildDocIndex(text, makeTestDoc(text)), testTypes, { spans: [], dismissed: [] }, [], false);

beforeEach(() => vi.useFakeTimers());
afterEach(() => vi.useRealTimers());

describe("Autosaver", () => {
  it("saves within a second of the first change, once for a burst of changes", async () => {
    const store = newStore();
    const calls: SaveAssignmentInput[] = [];
    const saver = new Autosaver({ store, version: 3, save: async (body) => (calls.push(body), { version: body.version + 1, state: "in_progress", updatedAt: "" }) });
    store.select(0, 1);
    store.label("PERSON");
    await vi.advanceTimersByTimeAsync(500);
    store.moveCursor(6);
    store.label("PLACE");
    expect(saver.status.kind).toBe("unsaved");
    await vi.advanceTimersByTimeAsync(500);
    expect(calls).toHaveLength(1);
    expect(calls[0]!.version).toBe(3);
    expect(calls[0]!.spans.map((s) => s.type)).toEqual(["PERSON", "PLACE"]);
    expect(saver.status.kind).toBe("saved");
    expect(saver.version).toBe(4);
    expect(saver.dirty).toBe(false);
  });

  it("a change made while a save is in flight, whose timer fires before that save answers, is saved right after it", async () => {
    const store = newStore();
    const calls: SaveAssignmentInput[] = [];
    let answer: (() => void) | null = null;
    const saver = new Autosaver({
      store,
      version: 1,
      save: (body) =>
        new Promise((resolve) => {
          calls.push(body);
          answer = () => resolve({ version: body.version + 1, state: "in_progress", updatedAt: "" });
        }),
    });
    store.select(0, 1);
    store.label("PERSON");
    await vi.advanceTimersByTimeAsync(800);
    expect(calls).toHaveLength(1);
    // The first save is slow; a change made now waits its debounce and finds the save still going.
    store.moveCursor(6);
    store.label("PLACE");
    await vi.advanceTimersByTimeAsync(1000);
    expect(calls).toHaveLength(1);
    answer!();
    await vi.advanceTimersByTimeAsync(1000);
    expect(calls).toHaveLength(2);
    expect(calls[1]!.version).toBe(2);
    expect(calls[1]!.spans.map((s) => s.type)).toEqual(["PERSON", "PLACE"]);
    answer!();
    await vi.advanceTimersByTimeAsync(0);
    expect(saver.status.kind).toBe("saved");
    expect(saver.dirty).toBe(false);
  });

  it("on a stale version loads the newer one, re-applies my change and saves it with the new version", async () => {
    const store = newStore();
    const calls: SaveAssignmentInput[] = [];
    let first = true;
    const saver = new Autosaver({
      store,
      version: 1,
      save: async (body) => {
        calls.push(body);
        if (first) {
          first = false;
          throw new ApiError(409, "stale_version", "changed", {
            version: 5,
            state: "in_progress",
            spans: [{ start: 15, end: 25, type: "PERSON", origin: "human" }, { start: 29, end: 38, type: "PLACE", origin: "human" }],
            dismissedSuggestions: [],
          });
        }
        return { version: body.version + 1, state: "in_progress", updatedAt: "" };
      },
    });
    store.select(0, 1);
    store.label("PERSON");
    store.select(5, 6);
    store.label("ORG");
    await vi.advanceTimersByTimeAsync(1000);
    // "Mira Quell" went on top of their spans; "in Gullhaven" overlaps their PLACE and is reported.
    expect(saver.conflict?.reapplied).toBe(1);
    expect(saver.conflict?.conflicts.map((c) => c.mine.type)).toEqual(["ORG"]);
    expect(calls).toHaveLength(2);
    expect(calls[1]!.version).toBe(5);
    expect(calls[1]!.spans.map((s) => `${s.start}-${s.type}`)).toEqual(["0-PERSON", "15-PERSON", "29-PLACE"]);
    expect(saver.status.kind).toBe("saved");
  });

  it("retries after a network failure and shows it", async () => {
    const store = newStore();
    let fail = 2;
    const saver = new Autosaver({
      store,
      version: 0,
      save: async (body) => {
        if (fail-- > 0) throw new ApiError(0, "network", "offline");
        return { version: body.version + 1, state: "in_progress", updatedAt: "" };
      },
    });
    store.moveCursor(0);
    store.label("PERSON");
    await vi.advanceTimersByTimeAsync(1000);
    expect(saver.status).toMatchObject({ kind: "retrying", reason: "You seem to be offline." });
    await vi.advanceTimersByTimeAsync(1000);
    expect(saver.status.kind).toBe("retrying");
    await vi.advanceTimersByTimeAsync(2000);
    expect(saver.status.kind).toBe("saved");
    expect(saver.version).toBe(1);
  });

  it("while the database restarts (503) retries after 1, 2 and 4 s and then saves the latest work once", async () => {
    const store = newStore();
    const calls: SaveAssignmentInput[] = [];
    let down = 3;
    const saver = new Autosaver({
      store,
      version: 0,
      save: async (body) => {
        calls.push(body);
        if (down-- > 0) throw new ApiError(503, "service_unavailable", "The service is briefly unavailable; nothing was changed.");
        return { version: body.version + 1, state: "in_progress", updatedAt: "" };
      },
    });
    store.moveCursor(0);
    store.label("PERSON");
    // The first save goes out after the 800 ms pause.
    await vi.advanceTimersByTimeAsync(800);
    expect(calls).toHaveLength(1);
    expect(saver.status).toMatchObject({ kind: "retrying", reason: "The server could not save just now." });
    // An edit during the outage waits for the retry instead of starting its own save.
    store.moveCursor(6);
    store.label("PLACE");
    await vi.advanceTimersByTimeAsync(999);
    expect(calls).toHaveLength(1);
    await vi.advanceTimersByTimeAsync(1);
    expect(calls).toHaveLength(2);
    await vi.advanceTimersByTimeAsync(1999);
    expect(calls).toHaveLength(2);
    await vi.advanceTimersByTimeAsync(1);
    expect(calls).toHaveLength(3);
    await vi.advanceTimersByTimeAsync(4000);
    expect(calls).toHaveLength(4);
    expect(saver.status.kind).toBe("saved");
    expect(calls.map((c) => c.version)).toEqual([0, 0, 0, 0]);
    expect(calls[3]!.spans.map((s) => s.type)).toEqual(["PERSON", "PLACE"]);
    expect(saver.version).toBe(1);
    expect(saver.dirty).toBe(false);
    await vi.advanceTimersByTimeAsync(20_000);
    expect(calls).toHaveLength(4);
  });

  it("stops and turns read-only when the assignment was submitted elsewhere", async () => {
    const store = newStore();
    const saver = new Autosaver({
      store,
      version: 0,
      save: async () => {
        throw new ApiError(409, "assignment_locked", "locked", { version: 2, state: "submitted", spans: [], dismissedSuggestions: [] });
      },
    });
    store.moveCursor(0);
    store.label("PERSON");
    await vi.advanceTimersByTimeAsync(1000);
    expect(saver.status.kind).toBe("locked");
    expect(store.readOnly).toBe(true);
  });
});
