import { describe, expect, it } from "vitest";
import { abilities, can, roles, signUpInputSchema } from "./accounts";

describe("signUpInputSchema", () => {
  it("lower-cases and trims the address and requires an organization name without an invitation", () => {
    const ok = signUpInputSchema.parse({ email: "  Ada@Example.TEST ", password: "0123456789", name: "Ada", organizationName: "Lab" });
    expect(ok.email).toBe("ada@example.test");
    const noOrg = signUpInputSchema.safeParse({ email: "ada@example.test", password: "0123456789", name: "Ada" });
    expect(noOrg.success).toBe(false);
    expect(noOrg.error?.issues.map((i) => i.path.join("."))).toEqual(["organizationName"]);
    const invited = signUpInputSchema.safeParse({ email: "ada@example.test", password: "0123456789", name: "Ada", invitationToken: "x".repeat(43) });
    expect(invited.success).toBe(true);
  });

  it("refuses short passwords and bad addresses", () => {
    const r = signUpInputSchema.safeParse({ email: "nope", password: "short", name: "", organizationName: "L" });
    expect(r.success).toBe(false);
    expect(new Set(r.error?.issues.map((i) => i.path[0]))).toEqual(new Set(["email", "password", "name", "organizationName"]));
  });
});

describe("can", () => {
  it("lets admins do everything and annotators only annotate", () => {
    for (const ability of Object.keys(abilities) as (keyof typeof abilities)[]) {
      expect(can("admin", ability)).toBe(true);
      expect(can("annotator", ability)).toBe(ability === "annotate");
    }
    expect(can(null, "annotate")).toBe(false);
    expect(roles.every((r) => can(r, "annotate"))).toBe(true);
    expect(can("data_lead", "train")).toBe(true);
    expect(can("manager", "train")).toBe(false);
  });
});
