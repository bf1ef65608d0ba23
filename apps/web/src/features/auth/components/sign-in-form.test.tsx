import { screen } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { HttpResponse, http } from "msw";
import { describe, expect, it, vi } from "vitest";
import { server } from "@/testing/server";
import { renderWithProviders } from "@/testing/test-utils";
import { SignInForm } from "./sign-in-form";

describe("SignInForm", () => {
  it("checks the fields before sending anything", async () => {
    const calls = vi.fn();
    server.use(http.post("/api/auth/sign-in", () => (calls(), HttpResponse.json({}))));
    renderWithProviders(<SignInForm onSignedIn={() => undefined} />);
    await userEvent.click(screen.getByRole("button", { name: "Sign in" }));
    expect(await screen.findByText("Enter a valid e-mail address.")).toBeInTheDocument();
    expect(screen.getByText("Enter your password.")).toBeInTheDocument();
    expect(calls).not.toHaveBeenCalled();
  });

  it("shows the server's answer for wrong credentials and keeps the user on the form", async () => {
    server.use(
      http.post("/api/auth/sign-in", () =>
        HttpResponse.json({ error: { code: "invalid_credentials", message: "E-mail or password is incorrect.", details: null } }, { status: 401 }),
      ),
    );
    const onSignedIn = vi.fn();
    renderWithProviders(<SignInForm onSignedIn={onSignedIn} />);
    await userEvent.type(screen.getByLabelText("E-mail address"), "ada@example.test");
    await userEvent.type(screen.getByLabelText("Password"), "wrong one");
    await userEvent.click(screen.getByRole("button", { name: "Sign in" }));
    expect(await screen.findByRole("alert")).toHaveTextContent("E-mail or password is incorrect.");
    expect(onSignedIn).not.toHaveBeenCalled();
  });

  it("hands the signed-in user to the caller", async () => {
    const me = { user: { id: "u1", email: "ada@example.test", name: "Ada", emailVerified: true }, memberships: [] };
    server.use(http.post("/api/auth/sign-in", () => HttpResponse.json(me)));
    const onSignedIn = vi.fn();
    renderWithProviders(<SignInForm onSignedIn={onSignedIn} />);
    await userEvent.type(screen.getByLabelText("E-mail address"), "ADA@example.test");
    await userEvent.type(screen.getByLabelText("Password"), "right one");
    await userEvent.click(screen.getByRole("button", { name: "Sign in" }));
    await vi.waitFor(() => expect(onSignedIn).toHaveBeenCalledWith(me));
  });
});
