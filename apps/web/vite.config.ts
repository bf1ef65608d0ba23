import path from "node:path";
import tailwindcss from "@tailwindcss/vite";
import react from "@vitejs/plugin-react";
import { defineConfig } from "vite";

// In development the Vite server proxies /api to the API (npm start serves the built app from the
// API itself, so there is one URL).
const apiTarget = process.env.TAGLOOM_API_URL ?? "http://127.0.0.1:8080";

export default defineConfig({
  plugins: [react(), tailwindcss()],
  resolve: {
    alias: {
      "@": path.resolve(import.meta.dirname, "src"),
      "@fonts": path.resolve(import.meta.dirname, "../../fonts"),
    },
  },
  server: { host: "127.0.0.1", proxy: { "/api": apiTarget } },
  build: { outDir: "dist", sourcemap: true, chunkSizeWarningLimit: 900 },
});
