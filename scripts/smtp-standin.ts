// The SMTP stand-in as a program: `tsx scripts/smtp-standin.ts [--port 2525] [--dir .data/mail]`.
// Defaults come from SMTP_PORT and MAIL_STANDIN_DIR, then 2525 and .data/mail.
// `npm start`, `npm run dev` and `npm test` run it; see scripts/smtp-standin-server.ts.
import path from "node:path";
import { startSmtpStandin } from "./smtp-standin-server";

function option(name: string): string | undefined {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? process.argv[i + 1] : undefined;
}

const port = Number(option("port") ?? process.env.SMTP_PORT ?? 2525);
const dir = path.resolve(option("dir") ?? process.env.MAIL_STANDIN_DIR ?? ".data/mail");
if (!Number.isInteger(port) || port < 0 || port > 65535) {
  console.error(`[sistership] mail stand-in: ${port} is not a port number`);
  process.exit(1);
}

try {
  const standin = await startSmtpStandin({ port, dir });
  console.log(`[sistership] mail stand-in: SMTP on 127.0.0.1:${standin.port}, keeping every message in ${dir}`);
  let stopping = false;
  const stop = () => {
    if (stopping) return;
    stopping = true;
    // Sessions still open get a short grace (closeTimeout), then the process ends regardless.
    setTimeout(() => process.exit(0), 3_000).unref();
    void standin.close().then(() => process.exit(0));
  };
  process.on("SIGTERM", stop);
  process.on("SIGINT", stop);
} catch (error) {
  const code = (error as NodeJS.ErrnoException).code;
  console.error(
    code === "EADDRINUSE"
      ? `[sistership] mail stand-in: port ${port} on 127.0.0.1 is busy. Stop what uses it, or choose another: SMTP_PORT=${port + 1}`
      : `[sistership] mail stand-in could not start: ${(error as Error).message}`,
  );
  process.exit(1);
}
