import fs from "node:fs";
import path from "node:path";
import { db } from "@/db/knex";
import { migrateLatest, migrationSource, migrationsDir } from "@/db/migration-source";

const [command, name] = process.argv.slice(2);

async function main(): Promise<void> {
  if (command === "latest") {
    const done = await migrateLatest(db);
    console.log(done.length ? `migrated: ${done.join(", ")}` : "database schema is up to date");
  } else if (command === "rollback") {
    const [, names] = (await db.migrate.rollback({ migrationSource })) as [number, string[]];
    console.log(names.length ? `rolled back: ${names.join(", ")}` : "nothing to roll back");
  } else if (command === "make") {
    if (!name || !/^[a-z0-9_]+$/.test(name)) throw new Error("usage: db:make <snake_case_name>");
    const stamp = new Date().toISOString().replace(/\D/g, "").slice(0, 14);
    const file = path.join(migrationsDir, `${stamp}_${name}.ts`);
    fs.writeFileSync(
      file,
      `import type { Knex } from "knex";\n\nexport async function up(knex: Knex): Promise<void> {\n}\n\nexport async function down(knex: Knex): Promise<void> {\n}\n`,
    );
    console.log(`created ${path.relative(process.cwd(), file)}`);
  } else {
    throw new Error("usage: migrate-cli latest|rollback|make <name>");
  }
}

main()
  .catch((err: unknown) => {
    console.error(err instanceof Error ? err.message : err);
    process.exitCode = 1;
  })
  .finally(() => db.destroy());
