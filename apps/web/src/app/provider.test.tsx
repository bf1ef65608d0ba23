import type { BillingState } from "@tagloom/contracts";
import { useMutation } from "@tanstack/react-query";
import { render, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { HttpResponse, http } from "msw";
import { describe, expect, it } from "vitest";
import { BuySeatsForm } from "@/features/billing/components/buy-seats-form";
import { ChangeSeatsForm } from "@/features/billing/components/change-seats-form";
import { saveAssignment } from "@/features/workspace/api/save-assignment";
import { api } from "@/lib/api-client";
import { freeBillingState } from "@/testing/billing-fixtures";
import { server } from "@/testing/server";
import { AppProvider } from "./provider";

const ORG = "33333333-3333-4333-8333-333333333333";
const free: BillingState = freeBillingState;
const OUTAGE = "The payments service cannot be reached right now. Nothing was changed; try again in a minute.";

const toastRegion = () => screen.getByTestId("toast-region");
// The toast would come one task after the error answer; a short real wait lets it appear if it is going to.
const settle = () => new Promise((r) => setTimeout(r, 50));

/** A button whose mutation does not show its error: the global toast is the only place it appears. */
function UnmarkedAction() {
  const m = useMutation({ mutationFn: () => api.post<void>("/things") });
  return (
    <button type="button" onClick={() => m.mutate()}>
      Do it
    </button>
  );
}

describe("ApiErrorToasts", () => {
  it("does not toast a payments outage the checkout form already shows as its notice", async () => {
    server.use(
      http.post(`/api/orgs/${ORG}/billing/checkout`, () =>
        HttpResponse.json({ error: { code: "payments_unavailable", message: OUTAGE, details: null } }, { status: 503 }),
      ),
      http.get(`/api/orgs/${ORG}/billing`, () => HttpResponse.json(free)),
    );
    render(
      <AppProvider>
        <BuySeatsForm orgId={ORG} state={free} />
      </AppProvider>,
    );
    await userEvent.click(screen.getByRole("button", { name: "Continue to payment" }));
    expect(await screen.findByRole("alert")).toHaveTextContent(OUTAGE);
    await settle();
    expect(screen.getAllByText(OUTAGE)).toHaveLength(1);
    expect(toastRegion()).toBeEmptyDOMElement();
  });

  it("does not toast a lost connection the seats form already shows", async () => {
    server.use(http.post(`/api/orgs/${ORG}/billing/seats`, () => HttpResponse.error()));
    const paid: BillingState = {
      ...free,
      plan: "per_seat",
      seatLimit: 8,
      subscription: { status: "active", seats: 8, cancelAtPeriodEnd: false, currentPeriodEnd: "2027-01-01T00:00:00.000Z", seatPrice: 900, currency: "eur" },
    };
    render(
      <AppProvider>
        <ChangeSeatsForm orgId={ORG} state={paid} />
      </AppProvider>,
    );
    await userEvent.click(screen.getByRole("button", { name: "Save seats" }));
    expect(await screen.findByRole("alert")).toHaveTextContent("Cannot reach the server.");
    await settle();
    expect(screen.getAllByText(/Cannot reach the server/)).toHaveLength(1);
    expect(toastRegion()).toBeEmptyDOMElement();
  });

  it("still toasts an outage of a mutation that shows no error of its own", async () => {
    server.use(http.post("/api/things", () => HttpResponse.json({ error: { code: "unavailable", message: "The service is down for a moment.", details: null } }, { status: 503 })));
    render(
      <AppProvider>
        <UnmarkedAction />
      </AppProvider>,
    );
    await userEvent.click(screen.getByRole("button", { name: "Do it" }));
    await waitFor(() => expect(within(toastRegion()).getByRole("alert")).toHaveTextContent("The service is down for a moment."));
  });

  it("does not toast a refusal (4xx) the screen is expected to explain", async () => {
    server.use(http.post("/api/things", () => HttpResponse.json({ error: { code: "conflict", message: "Already done.", details: null } }, { status: 409 })));
    render(
      <AppProvider>
        <UnmarkedAction />
      </AppProvider>,
    );
    await userEvent.click(screen.getByRole("button", { name: "Do it" }));
    await settle();
    expect(toastRegion()).toBeEmptyDOMElement();
  });

  it("does not toast an autosave fault, which the save status line shows, but still toasts other requests' faults", async () => {
    const path = `/api/orgs/${ORG}/corpora/c1/assignments/a1`;
    server.use(
      http.put(path, () => HttpResponse.json({ error: { code: "unavailable", message: "The database is restarting.", details: null } }, { status: 503 })),
      http.post("/api/things", () => HttpResponse.json({ error: { code: "unavailable", message: "The service is down for a moment.", details: null } }, { status: 503 })),
    );
    render(
      <AppProvider>
        <UnmarkedAction />
      </AppProvider>,
    );
    await expect(saveAssignment(ORG, "c1", "a1", { version: 1, spans: [] })).rejects.toMatchObject({ status: 503, shownByCaller: true });
    await settle();
    expect(toastRegion()).toBeEmptyDOMElement();
    await userEvent.click(screen.getByRole("button", { name: "Do it" }));
    await waitFor(() => expect(within(toastRegion()).getByRole("alert")).toHaveTextContent("The service is down for a moment."));
  });
});
