import type { BillingState } from "@tagloom/contracts";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Card, Notice } from "@/components/ui/card";
import { Field, Input } from "@/components/ui/field";
import { useStartCheckout } from "../api/start-checkout";
import { placeSeatsError, readSeats } from "./seats-input";

/** Free plan: choose a seat count and go to the payments service's checkout page. */
export function BuySeatsForm({ orgId, state }: { orgId: string; state: BillingState }) {
  const minimum = Math.max(state.seatsUsed, state.freeSeats + 1);
  const [text, setText] = useState(String(Math.max(minimum, state.seatsUsed + 2)));
  const [error, setError] = useState<string | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  const checkout = useStartCheckout(orgId);
  return (
    <Card>
      <h2 className="font-semibold text-ink-900">Buy seats</h2>
      <p className="mt-1 text-sm text-ink-700">
        The paid plan bills every seat monthly. Every member and every pending invitation takes a seat. You confirm the payment on the payments
        service's page and come back here.
      </p>
      <form
        className="mt-4 flex flex-wrap items-start gap-3"
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          const r = readSeats(text, minimum, `Choose at least ${minimum} seats: more than the free plan's ${state.freeSeats}, and enough for the ${state.seatsUsed} in use.`);
          if ("error" in r) return setError(r.error);
          setError(null);
          setFormError(null);
          checkout.mutate(r.seats, {
            onSuccess: (started) => window.location.assign(started.url),
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
          <Button type="submit" busy={checkout.isPending}>
            Continue to payment
          </Button>
        </div>
      </form>
      {formError ? (
        <Notice tone="error" className="mt-3">
          {formError}
        </Notice>
      ) : null}
      {state.checkoutPending ? (
        <Notice className="mt-4">A checkout was started and its payment is not confirmed yet. This page updates when the payments service confirms it.</Notice>
      ) : null}
    </Card>
  );
}
