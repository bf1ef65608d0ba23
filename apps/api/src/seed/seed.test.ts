import { describe, expect, it } from "vitest";
import { db } from "@/db/knex";
import { buildDemoDocuments } from "./demo-corpus";
import { seedDemoData } from "./seed";

describe("demo data", () => {
  it("builds documents whose spans cover exactly the names they stand for", () => {
    const docs = buildDemoDocuments();
    expect(docs).toHaveLength(24);
    expect(docs.filter((d) => d.spans).length).toBe(14);
    for (const d of docs) {
      for (const s of d.spans ?? []) {
        const covered = d.text.slice(s.start, s.end);
        expect(covered).toBe(covered.trim());
        expect(covered.length).toBeGreaterThan(1);
      }
    }
    expect(buildDemoDocuments()).toEqual(docs);
  });

  it("loads the organization, corpus, gold documents and a batch once", async () => {
    const first = await seedDemoData();
    expect(first.created).toBe(true);
    const orgId = first.organizationId!;
    expect(await db("memberships").where({ organization_id: orgId }).count({ n: "*" }).first()).toEqual({ n: 5 });
    const docs = await db("documents").where({ organization_id: orgId }).select("annotation_status", "split");
    expect(docs).toHaveLength(24);
    expect(docs.filter((d) => d.annotation_status === "gold")).toHaveLength(14);
    expect(docs.filter((d) => d.split === "test")).toHaveLength(3);
    expect(await db("assignments").where({ organization_id: orgId }).count({ n: "*" }).first()).toEqual({ n: 12 });
    const again = await seedDemoData();
    expect(again.created).toBe(false);
    expect(await db("documents").where({ organization_id: orgId }).count({ n: "*" }).first()).toEqual({ n: 24 });
  });
});
