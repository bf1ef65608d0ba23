import type { Role } from "@tagloom/contracts";

// An invented scenario: a small contract-review team at a fictional company. Every name, company
// and place here is made up.
export const DEMO_PASSWORD = "demo-password-1";
export const DEMO_ORGANIZATION = "Orvalen Contract Desk";

export const demoUsers: { email: string; name: string; role: Role }[] = [
  { email: "admin@demo.tagloom.test", name: "Morgan Vale", role: "admin" },
  { email: "manager@demo.tagloom.test", name: "Idris Halloway", role: "manager" },
  { email: "lead@demo.tagloom.test", name: "Tove Marrin", role: "data_lead" },
  { email: "annotator1@demo.tagloom.test", name: "Pilar Oswin", role: "annotator" },
  { email: "annotator2@demo.tagloom.test", name: "Ezra Quell", role: "annotator" },
];
