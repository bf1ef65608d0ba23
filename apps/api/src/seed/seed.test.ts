import { describe, expect, it } from "vitest";
import { db } from "@/db/knex";
import { buildDemoDocuments } from "./demo-corpus";
import { seedDemoData } from "./seed";

describe("demo data", () => {
  it("builds the same documents every time, with spans that cover whole names", () => {
    const docs = buildDemoDocuments();
    expect(docs).toHaveLength(400);
    expect(docs.filter((d) => d.gold)).toHaveLength(100);
    expect(docs.filter((d) => d.split === "test")).toHaveLength(25);
    expect(docs.filter((d) => d.format === "pdf")).toHaveLength(16);
    expect(docs.filter((d) => d.format === "docx")).toHaveLength(16);
    for (const d of docs) {
      for (const s of d.spans) {
        const covered = d.text.slice(s.start, s.end);
        expect(covered).toBe(covered.trim());
        expect(covered.length).toBeGreaterThan(1);
      }
    }
    const lengths = docs.map((d) => d.text.length);
    expect(Math.min(...lengths)).toBeLessThan(400);
    expect(Math.max(...lengths)).toBeGreaterThan(6000);
    expect(buildDemoDocuments()).toEqual(docs);
  });

  it("loads the organization, corpus, generated files, gold and two batches once", async () => {
    const first = await seedDemoData();
    expect(first.created).toBe(true);
    const orgId = first.organizationId!;
    expect(await db("memberships").where({ organization_id: orgId }).count({ n: "*" }).first()).toEqual({ n: 7 });
    const docs = await db("documents").where({ organization_id: orgId }).select("annotation_status", "split");
    expect(docs).toHaveLength(400);
    // 100 imported as gold, 4 settled in review.
    expect(docs.filter((d) => d.annotation_status === "gold")).toHaveLength(104);
    expect(docs.filter((d) => d.annotation_status === "submitted")).toHaveLength(6);
    expect(docs.filter((d) => d.split === "test")).toHaveLength(25);
    const files = await db("upload_files").where({ organization_id: orgId }).select("format", "state");
    expect(files.filter((f) => f.state === "ready")).toHaveLength(33);
    const states = await db("assignments").where({ organization_id: orgId }).select("state");
    expect(states).toHaveLength(20 + 24);
    expect(states.filter((s) => s.state === "accepted")).toHaveLength(8);
    expect(states.filter((s) => s.state === "submitted")).toHaveLength(12);
    expect(states.filter((s) => s.state === "in_progress")).toHaveLength(8);
    const again = await seedDemoData();
    expect(again.created).toBe(false);
    expect(await db("documents").where({ organization_id: orgId }).count({ n: "*" }).first()).toEqual({ n: 400 });
  });
});
