import type { BillingState } from "@tagloom/contracts";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Card, Notice } from "@/components/ui/card";
import { Field, Input } from "@/components/ui/field";
import { useToast } from "@/components/ui/toaster";
import { useChangeSeats } from "../api/change-seats";
import { plural } from "./format-billing";
import { placeSeatsError, readSeats } from "./seats-input";

/** Paid plan: raise or lower the seat count (never below the seats in use). */
export function ChangeSeatsForm({ orgId, state }: { orgId: string; state: BillingState }) {
  const paid = state.subscription?.seats ?? state.seatLimit;
  const [text, setText] = useState(String(paid));
  const [error, setError] = useState<string | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  const change = useChangeSeats(orgId);
  const toast = useToast();
  return (
    <Card>
      <h2 className="font-semibold text-ink-900">Change seats</h2>
      <p className="mt-1 text-sm text-ink-700">
        Added seats are invoiced at once for the rest of the period. You cannot go below the {state.seatsUsed} seats in use ({plural(state.members, "member", "members")} and{" "}
        {plural(state.pendingInvitations, "pending invitation", "pending invitations")}).
      </p>
      <form
        className="mt-4 flex flex-wrap items-start gap-3"
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          const r = readSeats(
            text,
            Math.max(1, state.seatsUsed),
            `${state.seatsUsed} seats are in use. Remove members or withdraw invitations before going below ${state.seatsUsed}.`,
          );
          if ("error" in r) return setError(r.error);
          setError(null);
          setFormError(null);
          change.mutate(r.seats, {
            onSuccess: (s) => toast.show(`You now pay for ${s.subscription?.seats ?? r.seats} seats.`, "success"),
            onError: (err) => {
              const place = placeSeatsError(err);
              if ("field" in place) setError(place.field);
              else setFormError(place.form);
            },
          });
        }}
      >
        <Field label="Seats" error={error ?? undefined}>
          {(id, d) => <Input id={id} className="w-32" inputMode="numeric" value={text} aria-describedby={d} aria-invalid={!!error} onChange={(e) => setText(e.target.value)} />}
        </Field>
        <div className="sm:pt-6">
          <Button type="submit" busy={change.isPending} disabled={state.subscription?.cancelAtPeriodEnd}>
            Save seats
          </Button>
        </div>
      </form>
      {formError ? (
        <Notice tone="error" className="mt-3">
          {formError}
        </Notice>
      ) : null}
    </Card>
  );
}
