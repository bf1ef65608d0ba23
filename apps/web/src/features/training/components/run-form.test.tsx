import { trainingConfigDefaults } from "@tagloom/contracts";
import { configure, screen } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { describe, expect, it, vi } from "vitest";
import { ApiError } from "@/lib/api-client";
import { renderWithProviders } from "@/testing/test-utils";
import { RunForm, defaultRunFormValues, errorsFromApi, toRunInput } from "./run-form";

configure({ asyncUtilTimeout: 5000 });

describe("the training-run form", () => {
  it("starts at the engine's defaults, says so, and sends them unchanged", async () => {
    const onSubmit = vi.fn().mockResolvedValue(null);
    renderWithProviders(<RunForm onSubmit={onSubmit} busy={false} />);
    expect(screen.getByLabelText("λ for emissions")).toHaveValue(String(trainingConfigDefaults.smoothing.emission));
    expect(screen.getAllByText("Default.").length).toBeGreaterThan(10);
    await userEvent.click(screen.getByRole("button", { name: "Start training" }));
    const sent = onSubmit.mock.calls[0]![0];
    // What the form sends for untouched fields is exactly the defaults table of the contracts.
    expect(sent).toMatchObject({
      smoothing: trainingConfigDefaults.smoothing,
      positionBuckets: trainingConfigDefaults.positionBuckets,
      rare: trainingConfigDefaults.rare,
      wordClasses: trainingConfigDefaults.wordClasses,
      order: trainingConfigDefaults.order,
      crossValidationFolds: trainingConfigDefaults.crossValidationFolds,
      semi: trainingConfigDefaults.semi,
      testSplit: trainingConfigDefaults.testSplit,
      seed: trainingConfigDefaults.seed,
    });
  });

  it("refuses a bad value with the shared schema's words and sends nothing", async () => {
    const onSubmit = vi.fn();
    renderWithProviders(<RunForm onSubmit={onSubmit} busy={false} />);
    const emission = screen.getByLabelText("λ for emissions");
    await userEvent.clear(emission);
    await userEvent.type(emission, "-1");
    expect(screen.getByText(/Changed; default 0.01/)).toBeInTheDocument();
    await userEvent.clear(screen.getByLabelText("Token-position boundaries"));
    await userEvent.type(screen.getByLabelText("Token-position boundaries"), "4, 2");
    await userEvent.click(screen.getByRole("button", { name: "Start training" }));
    expect(screen.getByText("Use a value of 0 or more.")).toBeInTheDocument();
    expect(screen.getByText("Boundaries must increase, e.g. 1, 2, 4.")).toBeInTheDocument();
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it("refuses learning from unlabelled documents with model order 2, on the right field", () => {
    const r = toRunInput({ ...defaultRunFormValues, order: "2", semi: "em" });
    expect(r.errors).toEqual({ semi: "Learning from unlabelled documents needs model order 1." });
  });

  it("puts the API's field details on their fields and shows a refusal in words", async () => {
    const onSubmit = vi
      .fn()
      .mockResolvedValueOnce(errorsFromApi(new ApiError(400, "validation_failed", "The request is not valid.", { fields: { "testSplit.percent": ["Hold out at most 90 %."] } })))
      .mockResolvedValueOnce(errorsFromApi(new ApiError(409, "empty_test_split", "The test split has no gold documents: mark some gold documents as test, or hold out a share.")));
    renderWithProviders(<RunForm onSubmit={onSubmit} busy={false} />);
    await userEvent.click(screen.getByRole("radio", { name: /random hold-out/ }));
    await userEvent.click(screen.getByRole("button", { name: "Start training" }));
    expect(await screen.findByText("Hold out at most 90 %.")).toBeInTheDocument();
    await userEvent.click(screen.getByRole("button", { name: "Start training" }));
    expect(await screen.findByText(/The test split has no gold documents/)).toBeInTheDocument();
  });

  it("starts word clusters and perceptron passes at 0 (off) and sends what is typed", async () => {
    const onSubmit = vi.fn().mockResolvedValue(null);
    renderWithProviders(<RunForm onSubmit={onSubmit} busy={false} />);
    expect(screen.getByLabelText("Word clusters")).toHaveValue("0");
    expect(screen.getByText(/Learnt from this corpus's documents without gold; 0 = off\./)).toBeInTheDocument();
    await userEvent.clear(screen.getByLabelText("Word clusters"));
    await userEvent.type(screen.getByLabelText("Word clusters"), "50");
    await userEvent.clear(screen.getByLabelText("Perceptron passes"));
    await userEvent.type(screen.getByLabelText("Perceptron passes"), "3");
    expect(screen.getAllByText(/Changed; default 0\./)).toHaveLength(2);
    expect(screen.getByLabelText("Perceptron weights")).toHaveValue("neighbours");
    await userEvent.click(screen.getByRole("button", { name: "Start training" }));
    expect(onSubmit.mock.calls[0]![0]).toMatchObject({ clusters: 50, perceptron: 3, perceptronFeatures: "neighbours" });
    await userEvent.selectOptions(screen.getByLabelText("Perceptron weights"), "Per word");
    await userEvent.click(screen.getByRole("button", { name: "Start training" }));
    expect(onSubmit.mock.calls[1]![0]).toMatchObject({ perceptron: 3, perceptronFeatures: "symbol" });
  });

  it("refuses out-of-range word clusters and perceptron passes with the shared schema's words", () => {
    const bad = (clusters: string, perceptron: string, order: "1" | "2" = "1") => toRunInput({ ...defaultRunFormValues, clusters, perceptron, order }).errors;
    expect(bad("1001", "21")).toEqual({ clusters: "Use at most 1000 clusters.", perceptron: "Use at most 20 passes." });
    expect(bad("-1", "-1")).toEqual({ clusters: "Use 0 clusters (off) or more.", perceptron: "Use 0 passes (off) or more." });
    expect(bad("2.5", "1.5")).toEqual({ clusters: "Use a whole number of clusters.", perceptron: "Use a whole number of passes." });
    expect(bad("many", "")).toEqual({ clusters: "Enter a number.", perceptron: "Enter a number." });
    // The feature perceptrons (the default) work with the trigram model too; weights per word need order 1.
    expect(bad("0", "2", "2")).toBeNull();
    expect(toRunInput({ ...defaultRunFormValues, perceptron: "2", order: "2", perceptronFeatures: "symbol" }).errors).toEqual({
      perceptronFeatures: "Weights per word need model order 1; choose word or neighbour features.",
    });
    expect(toRunInput({ ...defaultRunFormValues, clusters: "1000", perceptron: "20" }).input).toMatchObject({ clusters: 1000, perceptron: 20 });
  });
});
