import fs from "node:fs";
import path from "node:path";
import express, { type Express } from "express";

/** Serves the built web app and answers every other GET outside /api with its index.html. */
export function mountWebApp(app: Express, distDir: string): void {
  const index = path.join(distDir, "index.html");
  if (!fs.existsSync(index)) throw new Error(`the web app is not built: ${index} is missing (run the web build)`);
  app.use(express.static(distDir, { index: false, maxAge: "1h", setHeaders: noCacheForHtml }));
  app.get(/^(?!\/api(?:\/|$)).*/, (_req, res) => {
    res.setHeader("Cache-Control", "no-cache");
    res.sendFile(index);
  });
}

function noCacheForHtml(res: express.Response, file: string): void {
  if (file.endsWith(".html")) res.setHeader("Cache-Control", "no-cache");
}
