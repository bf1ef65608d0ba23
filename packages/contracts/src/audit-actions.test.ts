import { describe, expect, it } from "vitest";
import { auditActionLabel } from "./audit-actions";

describe("auditActionLabel", () => {
  it("names known actions in words and turns an unknown code into words rather than showing it raw", () => {
    expect(auditActionLabel("member.role_changed")).toBe("Member's role changed");
    expect(auditActionLabel("tagger.deleted")).toBe("Tagger deleted");
    expect(auditActionLabel("tagger.deleted")).not.toContain(".");
  });
});
