import nodemailer, { type Transporter } from "nodemailer";
import { env } from "@/config/env";

let transporter: Transporter | null = null;

/** The SMTP transport (locally: the mail catcher of apps/fakes). */
export function getMailTransport(): Transporter {
  transporter ??= nodemailer.createTransport({
    host: env.SMTP_HOST,
    port: env.SMTP_PORT,
    secure: env.SMTP_SECURE === "true",
    ignoreTLS: env.SMTP_SECURE !== "true" && env.NODE_ENV !== "production",
    auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASSWORD ?? "" } : undefined,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 20_000,
  });
  return transporter;
}
