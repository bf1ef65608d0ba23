import type { BillingState } from "@tagloom/contracts";
import { screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { HttpResponse, http } from "msw";
import { describe, expect, it } from "vitest";
import { freeBillingState } from "@/testing/billing-fixtures";
import { server } from "@/testing/server";
import { renderWithProviders } from "@/testing/test-utils";
import { BuySeatsForm } from "./buy-seats-form";

const ORG = "22222222-2222-4222-8222-222222222222";
const state: BillingState = freeBillingState;

// The answers are the API's own (apps/api/src/billing: PaymentsUnavailableError and the
// too_few_seats conflict of startCheckout).
describe("BuySeatsForm", () => {
  it("shows a payments outage for the whole form, not as a wrong seat count", async () => {
    server.use(
      http.post(`/api/orgs/${ORG}/billing/checkout`, () =>
        HttpResponse.json(
          { error: { code: "payments_unavailable", message: "The payments service cannot be reached right now. Nothing was changed; try again in a minute.", details: null } },
          { status: 503 },
        ),
      ),
      http.get(`/api/orgs/${ORG}/billing`, () => HttpResponse.json(state)),
    );
    const { container } = renderWithProviders(<BuySeatsForm orgId={ORG} state={state} />);
    await userEvent.clear(screen.getByLabelText("Seats"));
    await userEvent.type(screen.getByLabelText("Seats"), "7");
    await userEvent.click(screen.getByRole("button", { name: "Continue to payment" }));
    const alert = await within(container).findByRole("alert");
    expect(alert).toHaveTextContent("The payments service cannot be reached right now. Nothing was changed; try again in a minute.");
    expect(screen.getByLabelText("Seats")).toHaveAttribute("aria-invalid", "false");
    expect(screen.getByLabelText("Seats")).toHaveValue("7");
    expect(container).not.toHaveTextContent(/payments_unavailable|503/);
  });

  it("puts a refusal about the number beside the Seats field, and clears the form error on the next try", async () => {
    let calls = 0;
    server.use(
      http.post(`/api/orgs/${ORG}/billing/checkout`, () => {
        calls += 1;
        return calls === 1
          ? HttpResponse.json({ error: { code: "payments_unavailable", message: "The payments service cannot be reached right now.", details: null } }, { status: 503 })
          : HttpResponse.json(
              { error: { code: "too_few_seats", message: "Choose at least 8 seats.", details: { fields: { seats: ["At least 8."] }, minimum: 8 } } },
              { status: 409 },
            );
      }),
      http.get(`/api/orgs/${ORG}/billing`, () => HttpResponse.json(state)),
    );
    const { container } = renderWithProviders(<BuySeatsForm orgId={ORG} state={state} />);
    await userEvent.click(screen.getByRole("button", { name: "Continue to payment" }));
    expect(await within(container).findByRole("alert")).toHaveTextContent("The payments service cannot be reached right now.");
    await userEvent.click(screen.getByRole("button", { name: "Continue to payment" }));
    expect(await screen.findByText("Choose at least 8 seats.")).toBeInTheDocument();
    expect(screen.getByLabelText("Seats")).toHaveAttribute("aria-invalid", "true");
    expect(within(container).getAllByRole("alert").map((a) => a.textContent)).toEqual(["Choose at least 8 seats."]);
    expect(calls).toBe(2);
  });
});
