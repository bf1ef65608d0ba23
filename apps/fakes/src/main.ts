import { startMailCatcher } from "./mail-catcher";
import { startPaymentsFake } from "./payments/payments-fake";

// Starts every local stand-in for a hosted service (used by `npm start`).
function port(name: string, fallback: number): number {
  const v = process.env[name];
  const n = v ? Number(v) : fallback;
  if (!Number.isInteger(n) || n < 1 || n > 65535) {
    console.error(`${name} must be a port number, got ${v}`);
    process.exit(1);
  }
  return n;
}

const smtpPort = port("SMTP_PORT", 2525);
const mailHttpPort = port("MAIL_CATCHER_PORT", 2580);
const paymentsPort = port("PAYMENTS_PORT", 2590);
const appPort = port("PORT", 8080);
// Where the payments fake keeps its customers, subscriptions and invoices between restarts:
// `--payments-state FILE` or PAYMENTS_STATE_FILE (npm start puts it in the data dir); none: memory only.
const stateArg = process.argv.indexOf("--payments-state");
const paymentsStateFile = (stateArg >= 0 ? process.argv[stateArg + 1] : undefined) || process.env.PAYMENTS_STATE_FILE || undefined;
try {
  const mail = await startMailCatcher({ smtpPort, httpPort: mailHttpPort });
  console.log(`mail catcher: SMTP 127.0.0.1:${mail.smtpPort}, messages at ${mail.httpUrl}/messages`);
  const payments = await startPaymentsFake({
    port: paymentsPort,
    secretKey: process.env.STRIPE_SECRET_KEY || undefined,
    webhookSecret: process.env.STRIPE_WEBHOOK_SECRET || undefined,
    webhookUrl: process.env.PAYMENTS_WEBHOOK_URL || `http://127.0.0.1:${appPort}/api/billing/webhook`,
    stateFile: paymentsStateFile,
  });
  console.log(`payments fake: API and test checkout pages at ${payments.url}${paymentsStateFile ? `, state in ${paymentsStateFile}` : ""}`);
  const stop = () => void Promise.all([mail.stop(), payments.stop()]).then(() => process.exit(0));
  process.on("SIGTERM", stop);
  process.on("SIGINT", stop);
} catch (err) {
  const e = err as NodeJS.ErrnoException;
  if (e.code === "EADDRINUSE") {
    console.error(`a fake's port is taken (SMTP ${smtpPort}, catcher HTTP ${mailHttpPort}, payments ${paymentsPort}); choose others with SMTP_PORT, MAIL_CATCHER_PORT and PAYMENTS_PORT`);
  } else {
    console.error(e);
  }
  process.exit(1);
}
