import { createApp } from "@/app";
import { env } from "@/config/env";
import { db } from "@/db/knex";
import { stopJobSender } from "@/jobs/boss";
import { logger } from "@/logger";

const app = createApp();
const server = app.listen(env.PORT, env.HOST, () => {
  logger.info({ url: `http://${env.HOST}:${env.PORT}` }, "API listening");
});
server.on("error", (err: NodeJS.ErrnoException) => {
  if (err.code === "EADDRINUSE") {
    logger.fatal(`port ${env.PORT} on ${env.HOST} is taken; choose another with PORT=<port>`);
  } else {
    logger.fatal({ err }, "server failed");
  }
  process.exit(1);
});

async function shutdown(signal: string): Promise<void> {
  logger.info({ signal }, "API shutting down");
  server.close();
  server.closeAllConnections();
  await stopJobSender().catch(() => undefined);
  await db.destroy().catch(() => undefined);
  process.exit(0);
}
process.on("SIGTERM", () => void shutdown("SIGTERM"));
process.on("SIGINT", () => void shutdown("SIGINT"));
