import { defineConfig, mergeConfig } from "vitest/config";
import viteConfig from "./vite.config.ts";

export default mergeConfig(
  viteConfig,
  defineConfig({
    test: {
      projects: [
        {
          extends: true,
          test: {
            name: "unit",
            environment: "jsdom",
            include: ["src/**/*.test.{ts,tsx}"],
            setupFiles: ["src/testing/setup.ts"],
          },
        },
        {
          extends: true,
          test: {
            name: "browser",
            environment: "node",
            include: ["e2e/**/*.test.ts"],
            globalSetup: ["e2e/support/global-setup.ts"],
            testTimeout: 90_000,
            hookTimeout: 120_000,
            fileParallelism: false,
          },
        },
      ],
    },
  }),
);
