import { Link } from "react-router";
import { Notice } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { ApiError } from "@/lib/api-client";

/** True for the API's 402 refusal of an invitation that needs a seat the organization lacks. */
export function isSeatLimitError(err: unknown): err is ApiError {
  return err instanceof ApiError && err.code === "seat_limit_reached";
}

/** The seat refusal with the way out: more seats on the Billing page (invitations are admin-only). */
export function SeatLimitNotice({ orgId, message }: { orgId: string; message: string }) {
  return (
    <Notice tone="warn">
      <p>{message}</p>
      <Link to={paths.org.billing.build(orgId)} className="mt-1 inline-block font-semibold text-ink-700 underline underline-offset-2">
        Add seats on the Billing page
      </Link>
    </Notice>
  );
}
