export * from "./accounts";
export * from "./errors";
export * from "./health";
export * from "./spans";
