import { db } from "@/db/knex";
import { pgPool } from "@/db/pg-pool";
import { stopJobSender } from "@/jobs/boss";
import { dropDemoOrganization } from "./demo-reset";

// `npm run demo:reset`, first half: drops the demo organization and its users (seed-cli loads it again).
try {
  const n = await dropDemoOrganization();
  console.log(n ? "demo organization removed" : "no demo organization to remove");
} catch (err) {
  console.error(err);
  process.exitCode = 1;
} finally {
  await stopJobSender();
  await db.destroy();
  await pgPool.end();
}
