import type { BillingState } from "@tagloom/contracts";
import { screen } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { HttpResponse, http } from "msw";
import { describe, expect, it } from "vitest";
import { server } from "@/testing/server";
import { renderWithProviders } from "@/testing/test-utils";
import { PaymentFailedBanner } from "./payment-failed-banner";
// The app's one date format (browser locale), so the test holds in any locale.
import { formatDate } from "@/lib/dates";

const ORG = "11111111-1111-4111-8111-111111111111";
const state: BillingState = {
  plan: "per_seat",
  freeSeats: 5,
  seatLimit: 8,
  seatsUsed: 6,
  members: 6,
  pendingInvitations: 0,
  subscription: { status: "past_due", seats: 8, cancelAtPeriodEnd: false, currentPeriodEnd: "2027-01-31T00:00:00.000Z", seatPrice: 900, currency: "eur" },
  nextInvoiceAt: "2027-01-31T00:00:00.000Z",
  paymentFailed: true,
  checkoutPending: false,
  invoices: [],
};

describe("PaymentFailedBanner", () => {
  it("says until when the seats stay, and shows a declined retry's reason", async () => {
    let retries = 0;
    server.use(
      http.post(`/api/orgs/${ORG}/billing/retry-payment`, () => {
        retries += 1;
        return HttpResponse.json({ error: { code: "payment_declined", message: "The payment was declined: Your card was declined.", details: null } }, { status: 402 });
      }),
      http.get(`/api/orgs/${ORG}/billing`, () => HttpResponse.json(state)),
    );
    renderWithProviders(<PaymentFailedBanner orgId={ORG} state={state} />);
    expect(screen.getByRole("alert")).toHaveTextContent(`Your 8 seats stay until ${formatDate("2027-01-31T00:00:00.000Z")}`);
    await userEvent.click(screen.getByRole("button", { name: "Retry the payment" }));
    expect(await screen.findByText("The payment was declined: Your card was declined.")).toBeInTheDocument();
    expect(retries).toBe(1);
  });
});
