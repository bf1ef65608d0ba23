import { pino } from "pino";
import { env } from "@/config/env";

/** The process logger: JSON lines on stdout. */
export const logger = pino({ level: env.NODE_ENV === "test" && env.LOG_LEVEL === "info" ? "silent" : env.LOG_LEVEL });
