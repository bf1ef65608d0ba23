import { screen } from "@testing-library/react";
import { HttpResponse, http } from "msw";
import { describe, expect, it } from "vitest";
import { server } from "@/testing/server";
import { renderWithProviders } from "@/testing/test-utils";
import { HealthStatus } from "./health-status";

describe("HealthStatus", () => {
  it("says the service is up when the API reports the database up", async () => {
    server.use(http.get("/api/health", () => HttpResponse.json({ ok: true, db: "up" })));
    renderWithProviders(<HealthStatus />);
    expect(await screen.findByText("Service and database up")).toBeInTheDocument();
  });

  it("says the database is down on a 503", async () => {
    server.use(http.get("/api/health", () => HttpResponse.json({ ok: false, db: "down" }, { status: 503 })));
    renderWithProviders(<HealthStatus />);
    expect(await screen.findByText("Database down")).toBeInTheDocument();
  });

  it("says the service is unreachable when the request fails", async () => {
    server.use(http.get("/api/health", () => HttpResponse.error()));
    renderWithProviders(<HealthStatus />);
    expect(await screen.findByText("Service unreachable")).toBeInTheDocument();
  });
});
