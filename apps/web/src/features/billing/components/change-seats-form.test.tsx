import type { BillingState } from "@tagloom/contracts";
import { screen } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { HttpResponse, http } from "msw";
import { describe, expect, it } from "vitest";
import { server } from "@/testing/server";
import { renderWithProviders } from "@/testing/test-utils";
import { ChangeSeatsForm } from "./change-seats-form";

const ORG = "11111111-1111-4111-8111-111111111111";
const state: BillingState = {
  plan: "per_seat",
  freeSeats: 5,
  seatLimit: 8,
  seatsUsed: 6,
  members: 5,
  pendingInvitations: 1,
  subscription: { status: "active", seats: 8, cancelAtPeriodEnd: false, currentPeriodEnd: "2027-01-01T00:00:00.000Z", seatPrice: 900, currency: "eur" },
  nextInvoiceAt: "2027-01-01T00:00:00.000Z",
  paymentFailed: false,
  checkoutPending: false,
  invoices: [],
};

describe("ChangeSeatsForm", () => {
  it("refuses going below the seats in use with the reason, without asking the server", async () => {
    let called = false;
    server.use(http.post(`/api/orgs/${ORG}/billing/seats`, () => ((called = true), HttpResponse.json(state))));
    renderWithProviders(<ChangeSeatsForm orgId={ORG} state={state} />);
    await userEvent.clear(screen.getByLabelText("Seats"));
    await userEvent.type(screen.getByLabelText("Seats"), "4");
    await userEvent.click(screen.getByRole("button", { name: "Save seats" }));
    expect(await screen.findByText(/6 seats are in use\. Remove members or withdraw invitations before going below 6\./)).toBeInTheDocument();
    expect(called).toBe(false);
  });

  it("sends the new count and shows the server's refusal when it has one", async () => {
    let body: unknown = null;
    server.use(
      http.post(`/api/orgs/${ORG}/billing/seats`, async ({ request }) => {
        body = await request.json();
        return HttpResponse.json({ error: { code: "payments_unavailable", message: "The payments service cannot be reached right now.", details: null } }, { status: 503 });
      }),
      http.get(`/api/orgs/${ORG}/billing`, () => HttpResponse.json(state)),
    );
    renderWithProviders(<ChangeSeatsForm orgId={ORG} state={state} />);
    await userEvent.clear(screen.getByLabelText("Seats"));
    await userEvent.type(screen.getByLabelText("Seats"), "10");
    await userEvent.click(screen.getByRole("button", { name: "Save seats" }));
    expect(await screen.findByText("The payments service cannot be reached right now.")).toBeInTheDocument();
    // An outage is not a wrong number: the field is not marked invalid.
    expect(screen.getByLabelText("Seats")).toHaveAttribute("aria-invalid", "false");
    expect(body).toEqual({ seats: 10 });
  });
});
