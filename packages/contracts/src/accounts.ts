import { z } from "zod";

export const roles = ["admin", "manager", "data_lead", "annotator"] as const;
export const roleSchema = z.enum(roles);
export type Role = z.infer<typeof roleSchema>;

/** Plain names of the roles for screens. */
export const roleLabels: Record<Role, string> = {
  admin: "Admin",
  manager: "Manager",
  data_lead: "Data lead",
  annotator: "Annotator",
};

export const emailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .max(254, "E-mail address is too long.")
  .pipe(z.email("Enter a valid e-mail address."));

export const passwordSchema = z
  .string()
  .min(10, "Use at least 10 characters.")
  .max(200, "Use at most 200 characters.");

export const personNameSchema = z.string().trim().min(1, "Enter your name.").max(100, "Use at most 100 characters.");
export const organizationNameSchema = z
  .string()
  .trim()
  .min(2, "Use at least 2 characters.")
  .max(100, "Use at most 100 characters.");

export const signUpInputSchema = z
  .object({
    email: emailSchema,
    password: passwordSchema,
    name: personNameSchema,
    organizationName: organizationNameSchema.optional(),
    invitationToken: z.string().min(10).max(200).optional(),
  })
  .refine((v) => v.organizationName !== undefined || v.invitationToken !== undefined, {
    path: ["organizationName"],
    message: "Name your organization.",
  });
export type SignUpInput = z.infer<typeof signUpInputSchema>;

export const signInInputSchema = z.object({
  email: emailSchema,
  password: z.string().min(1, "Enter your password.").max(200),
});
export type SignInInput = z.infer<typeof signInInputSchema>;

export const passwordResetRequestSchema = z.object({ email: emailSchema });
export const passwordResetConfirmSchema = z.object({ token: z.string().min(10).max(200), password: passwordSchema });
export const verifyEmailInputSchema = z.object({ token: z.string().min(10).max(200) });

export type Membership = { organizationId: string; organizationName: string; role: Role };
export type CurrentUser = { id: string; email: string; name: string; emailVerified: boolean };
export type Me = { user: CurrentUser; memberships: Membership[] };

export const createOrganizationInputSchema = z.object({ name: organizationNameSchema });
export const renameOrganizationInputSchema = z.object({ name: organizationNameSchema });
export const deleteOrganizationInputSchema = z.object({ confirmName: z.string() });

export type Member = { userId: string; name: string; email: string; role: Role; joinedAt: string };
export const updateMemberInputSchema = z.object({ role: roleSchema });

export const createInvitationInputSchema = z.object({ email: emailSchema, role: roleSchema });
export type CreateInvitationInput = z.infer<typeof createInvitationInputSchema>;
export type InvitationStatus = "pending" | "accepted" | "revoked" | "expired";
export type Invitation = {
  id: string;
  email: string;
  role: Role;
  status: InvitationStatus;
  invitedBy: string | null;
  expiresAt: string;
  lastSentAt: string;
  sendCount: number;
  createdAt: string;
};
/** What an invitation link shows before it is accepted. */
export type InvitationPreview = {
  organizationName: string;
  email: string;
  role: Role;
  invitedBy: string | null;
  status: InvitationStatus;
  accountExists: boolean;
};

export const auditQuerySchema = z.object({
  action: z.string().max(60).optional(),
  actor: z.string().max(254).optional(),
  from: z.iso.datetime({ offset: true }).optional(),
  to: z.iso.datetime({ offset: true }).optional(),
  cursor: z.string().regex(/^\d+$/, "Invalid cursor.").optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
});
export type AuditQuery = z.infer<typeof auditQuerySchema>;
export type AuditEvent = {
  id: string;
  action: string;
  actor: string;
  targetType: string | null;
  targetId: string | null;
  targetLabel: string | null;
  details: Record<string, unknown>;
  ip: string | null;
  createdAt: string;
};

export type OutboxMessage = {
  id: string;
  to: string[];
  from: string;
  subject: string;
  text: string;
  html: string;
  receivedAt: string;
};

export type AppMeta = { environment: "development" | "test" | "production"; outbox: boolean };

/**
 * What each role may do (admins may do everything). The API enforces its own guards; the web app
 * uses this to hide what a role cannot do.
 */
export const abilities = {
  manageMembers: ["admin"],
  viewAudit: ["admin"],
  manageBilling: ["admin"],
  manageCorpora: ["admin", "manager"],
  manageBatches: ["admin", "manager"],
  review: ["admin", "manager"],
  annotate: ["admin", "manager", "data_lead", "annotator"],
  /** Start, cancel and repeat training runs; choose the corpus's suggester. */
  train: ["admin", "data_lead"],
  /** See runs, taggers and comparisons read-only (managers follow the data lead's work). */
  viewTraining: ["admin", "manager", "data_lead"],
  /** Download a tagger and its evaluation. */
  downloadTaggers: ["admin", "data_lead"],
  exportData: ["admin", "manager", "data_lead"],
  manageTokens: ["admin", "data_lead"],
} as const satisfies Record<string, readonly Role[]>;
export type Ability = keyof typeof abilities;

export function can(role: Role | null | undefined, ability: Ability): boolean {
  return role != null && (abilities[ability] as readonly Role[]).includes(role);
}
