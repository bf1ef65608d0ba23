import { startMailCatcher } from "./mail-catcher";

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
try {
  const mail = await startMailCatcher({ smtpPort, httpPort: mailHttpPort });
  console.log(`mail catcher: SMTP 127.0.0.1:${mail.smtpPort}, messages at ${mail.httpUrl}/messages`);
  const stop = () => void mail.stop().then(() => process.exit(0));
  process.on("SIGTERM", stop);
  process.on("SIGINT", stop);
} catch (err) {
  const e = err as NodeJS.ErrnoException;
  if (e.code === "EADDRINUSE") {
    console.error(`a fake's port is taken (SMTP ${smtpPort}, catcher HTTP ${mailHttpPort}); choose others with SMTP_PORT and MAIL_CATCHER_PORT`);
  } else {
    console.error(e);
  }
  process.exit(1);
}
