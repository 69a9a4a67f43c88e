// The SMTP stand-in as a program: `tsx scripts/smtp-standin.ts [--port 2525] [--dir .data/mail]`.
// Defaults come from SMTP_PORT and MAIL_STANDIN_DIR, then 2525 and .data/mail.
// `npm start`, `npm run dev` and `npm test` run it; see scripts/smtp-standin-server.ts.
import path from "node:path";
import { option, runStandin } from "./lib/standin-cli";
import { startSmtpStandin } from "./smtp-standin-server";

const port = Number(option("port") ?? process.env.SMTP_PORT ?? 2525);
const dir = path.resolve(option("dir") ?? process.env.MAIL_STANDIN_DIR ?? ".data/mail");
await runStandin({
  label: "mail stand-in",
  port,
  start: () => startSmtpStandin({ port, dir }),
  started: (standin) => `SMTP on 127.0.0.1:${standin.port}, keeping every message in ${dir}`,
  busyHint: (p) => `SMTP_PORT=${p + 1}`,
});
