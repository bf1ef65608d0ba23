// Copies the woff2 files the web app ships from the npm font package into the repository's
// fonts/ folder (git-ignored), so the app serves its own fonts and never calls an outside host.
import fs from "node:fs";
import path from "node:path";
import { createRequire } from "node:module";
import { fileURLToPath } from "node:url";

const here = path.dirname(fileURLToPath(import.meta.url));
const fontsDir = path.resolve(here, "../../../fonts");
const require = createRequire(import.meta.url);
const pkgDir = path.dirname(require.resolve("@fontsource-variable/inter/package.json"));

const files = ["inter-latin-wght-normal.woff2", "inter-latin-ext-wght-normal.woff2"];
fs.mkdirSync(fontsDir, { recursive: true });
for (const f of files) {
  const to = path.join(fontsDir, f);
  if (!fs.existsSync(to)) fs.copyFileSync(path.join(pkgDir, "files", f), to);
}
fs.copyFileSync(path.join(pkgDir, "LICENSE"), path.join(fontsDir, "Inter-LICENSE.txt"));
