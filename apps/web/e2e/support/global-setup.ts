import type { TestProject } from "vitest/node";
import { startProduct } from "./product";

declare module "vitest" {
  export interface ProvidedContext {
    baseUrl: string;
    mailUrl: string;
  }
}

/** One running product for the browser tests of this run; stopped when they end. */
export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  const product = await startProduct();
  project.provide("baseUrl", product.baseUrl);
  project.provide("mailUrl", product.mailUrl);
  return product.stop;
}
