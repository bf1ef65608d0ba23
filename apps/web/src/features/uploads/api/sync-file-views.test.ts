import { describe, expect, it } from "vitest";
import { fileViewsAgree } from "./sync-file-views";

const key = (kind: string) => ["orgs", "o", "corpora", "c", kind, {}];
const f = (id: string, state: string) => ({ id, state });
const filesPage = (items: Array<{ id: string; state: string }>, pending: number) => ({ queryKey: key("files"), data: { items, nextCursor: null, counts: { queued: pending, processing: 0, ready: 0, failed: 0 } } });
const header = (pendingFiles: number) => ({ queryKey: key("detail"), data: { pendingFiles } });
const upload = (files: Array<{ id: string; state: string }>) => ({ queryKey: key("uploads"), data: { upload: {}, files } });

describe("fileViewsAgree", () => {
  it("accepts a round where every answer tells the same state of each file", () => {
    expect(fileViewsAgree([header(1), filesPage([f("a", "queued"), f("b", "ready")], 1), upload([f("a", "queued")])])).toBe(true);
  });

  it("refuses a round where the server moved a file between two requests", () => {
    expect(fileViewsAgree([filesPage([f("a", "queued")], 1), upload([f("a", "ready")])])).toBe(false);
  });

  it("refuses a header that counts other pending files than the files list", () => {
    expect(fileViewsAgree([header(0), filesPage([f("a", "queued")], 1)])).toBe(false);
  });
});
