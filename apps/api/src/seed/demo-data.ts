import type { Role } from "@tagloom/contracts";

// An invented scenario: a small contract-review team. Every person and organization name here is
// made up from syllables; none is meant to match a real one.
export const DEMO_PASSWORD = "demo-password-1";
export const DEMO_ORGANIZATION = "Quenmarrow Contract Desk";

export const demoUsers: { email: string; name: string; role: Role }[] = [
  { email: "admin@demo.tagloom.test", name: "Morvane Taskel", role: "admin" },
  { email: "manager@demo.tagloom.test", name: "Idrel Havonsk", role: "manager" },
  { email: "lead@demo.tagloom.test", name: "Tovika Marrendel", role: "data_lead" },
  { email: "annotator1@demo.tagloom.test", name: "Pelia Osquen", role: "annotator" },
  { email: "annotator2@demo.tagloom.test", name: "Ezrel Quovane", role: "annotator" },
  { email: "annotator3@demo.tagloom.test", name: "Saevin Drolacq", role: "annotator" },
  { email: "annotator4@demo.tagloom.test", name: "Brannic Tuvel", role: "annotator" },
];

/** Invited by the admin and not yet answered: the invitation e-mail is in the Outbox. */
export const DEMO_PENDING_INVITEE = "fennick.orlavie@demo.tagloom.test";
