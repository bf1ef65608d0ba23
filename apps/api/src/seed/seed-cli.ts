import { db } from "@/db/knex";
import { pgPool } from "@/db/pg-pool";
import { stopJobSender } from "@/jobs/boss";
import { seedDemoData } from "./seed";

// Prints "demo data loaded" and, on first load only, the lines start.sh reads for its closing
// message (the API token's secret exists nowhere else).
try {
  const result = await seedDemoData();
  if (result.created) {
    console.log("demo data loaded");
    console.log(`DEMO_ORG_ID=${result.organizationId}`);
    console.log(`DEMO_CORPUS_ID=${result.corpusId}`);
    console.log(`DEMO_API_TOKEN=${result.apiToken}`);
  } else {
    console.log("demo data already present");
  }
} catch (err) {
  console.error(err);
  process.exitCode = 1;
} finally {
  await stopJobSender();
  await db.destroy();
  await pgPool.end();
}
