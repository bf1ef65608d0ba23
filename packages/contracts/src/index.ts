export * from "./errors";
export * from "./health";
