import { createApiToken } from "@/api-tokens/api-tokens.service";
import type { Actor } from "@/audit/audit.service";

export const DEMO_TOKEN_NAME = "Demo pipeline";

/** The demo's organization API token; its secret is returned here once and never stored. */
export async function seedApiToken(organizationId: string, admin: Actor & { userId: string }): Promise<string> {
  const created = await createApiToken(organizationId, { name: DEMO_TOKEN_NAME }, admin);
  return created.token;
}
