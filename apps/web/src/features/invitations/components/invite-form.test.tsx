import { screen } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { HttpResponse, http } from "msw";
import { describe, expect, it } from "vitest";
import { server } from "@/testing/server";
import { renderWithProviders } from "@/testing/test-utils";
import { InviteForm } from "./invite-form";

const ORG = "11111111-1111-4111-8111-111111111111";

describe("InviteForm", () => {
  it("puts the server's field error on the e-mail field (already a member)", async () => {
    server.use(
      http.post(`/api/orgs/${ORG}/invitations`, () =>
        HttpResponse.json(
          { error: { code: "already_member", message: "juno@example.test is already a member.", details: { fields: { email: ["Already a member."] } } } },
          { status: 409 },
        ),
      ),
    );
    renderWithProviders(<InviteForm orgId={ORG} />);
    await userEvent.type(screen.getByLabelText("E-mail address"), "juno@example.test");
    await userEvent.click(screen.getByRole("button", { name: "Send invitation" }));
    expect(await screen.findByText("juno@example.test is already a member.")).toBeInTheDocument();
    expect(screen.getByText("Already a member.")).toBeInTheDocument();
  });

  it("sends the chosen role and clears the address after success", async () => {
    let body: unknown = null;
    server.use(
      http.post(`/api/orgs/${ORG}/invitations`, async ({ request }) => {
        body = await request.json();
        return HttpResponse.json({ id: "i1", email: "juno@example.test", role: "data_lead", status: "pending" }, { status: 201 });
      }),
      http.get(`/api/orgs/${ORG}/invitations`, () => HttpResponse.json({ items: [], nextCursor: null })),
    );
    renderWithProviders(<InviteForm orgId={ORG} />);
    await userEvent.type(screen.getByLabelText("E-mail address"), "Juno@Example.test");
    await userEvent.selectOptions(screen.getByLabelText("Role"), "data_lead");
    await userEvent.click(screen.getByRole("button", { name: "Send invitation" }));
    expect(await screen.findByText("Invitation sent to juno@example.test.")).toBeInTheDocument();
    expect(body).toEqual({ email: "juno@example.test", role: "data_lead" });
    expect(screen.getByLabelText("E-mail address")).toHaveValue("");
  });

  it("shows the seat refusal (402) with a link to add seats", async () => {
    server.use(
      http.post(`/api/orgs/${ORG}/invitations`, () =>
        HttpResponse.json(
          {
            error: {
              code: "seat_limit_reached",
              message: "All 5 seats are in use (4 members and 1 pending invitation). An admin can add seats on the Billing page.",
              details: { seatsUsed: 5, seatLimit: 5, plan: "free" },
            },
          },
          { status: 402 },
        ),
      ),
    );
    renderWithProviders(<InviteForm orgId={ORG} />);
    await userEvent.type(screen.getByLabelText("E-mail address"), "juno@example.test");
    await userEvent.click(screen.getByRole("button", { name: "Send invitation" }));
    expect(await screen.findByText(/All 5 seats are in use/)).toBeInTheDocument();
    expect(screen.getByRole("link", { name: "Add seats on the Billing page" })).toHaveAttribute("href", `/o/${ORG}/billing`);
  });
});
