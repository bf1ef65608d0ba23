import { db } from "@/db/knex";
import { pgPool } from "@/db/pg-pool";
import { stopJobSender } from "@/jobs/boss";
import { seedDemoData } from "./seed";

try {
  const result = await seedDemoData();
  console.log(result.created ? "demo data loaded" : "demo data already present");
} catch (err) {
  console.error(err);
  process.exitCode = 1;
} finally {
  await stopJobSender();
  await db.destroy();
  await pgPool.end();
}
