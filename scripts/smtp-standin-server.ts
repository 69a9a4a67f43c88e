// The local stand-in for an SMTP relay, used by `npm start`, `npm run dev` and `npm test`: a real
// SMTP server on loopback that accepts every message and keeps it as one JSON file per message,
// for the development mail page and the tests to read. It delivers nothing anywhere.
import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { simpleParser } from "mailparser";
import { SMTPServer } from "smtp-server";

/** One received message, as stored in `<dir>/<receivedAt>-<id>.json`; sort by receivedAt, then id. */
export type StoredMail = {
  id: string;
  receivedAt: string;
  /** The From header, as written ("Sistership <no-reply@...>"). */
  from: string;
  /** The envelope recipients (RCPT TO), the addresses the message was actually delivered to. */
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  /** Every header field, by lower-case name (repeated fields joined by newlines). */
  headers: Record<string, string>;
};

export const MAX_MESSAGE_BYTES = 10 * 1024 * 1024;

// Orders the messages received within one millisecond: ids sort in the order of arrival.
let sequence = 0;

function headerMap(lines: ReadonlyArray<{ key: string; line: string }>): Record<string, string> {
  const headers: Record<string, string> = {};
  for (const { key, line } of lines) {
    // "Name: value", possibly folded over several lines (RFC 5322 §2.2.3): unfold it.
    const value = line.slice(line.indexOf(":") + 1).replace(/\r?\n[ \t]+/g, " ").trim();
    headers[key] = key in headers ? `${headers[key]}\n${value}` : value;
  }
  return headers;
}

/** Writes the message next to the others, atomically, so that a reader never sees half a file. */
function store(dir: string, mail: StoredMail) {
  const name = `${mail.receivedAt.replace(/[:.]/g, "-")}-${mail.id}.json`;
  const tmp = path.join(dir, `.${name}.tmp`);
  fs.writeFileSync(tmp, JSON.stringify(mail, null, 2));
  fs.renameSync(tmp, path.join(dir, name));
}

/** Starts the stand-in on 127.0.0.1:`port` (0 picks a free port). */
export async function startSmtpStandin(options: { port: number; dir: string; host?: string }) {
  const dir = path.resolve(options.dir);
  fs.mkdirSync(dir, { recursive: true });
  const server = new SMTPServer({
    banner: "Sistership mail stand-in (keeps every message, delivers none)",
    authOptional: true,
    // Plain SMTP on loopback: no TLS, hence no certificate to present.
    disabledCommands: ["STARTTLS"],
    // Advertised with the SIZE extension (RFC 1870) and refused above it with 552.
    size: MAX_MESSAGE_BYTES,
    rejectOversized: true,
    logger: false,
    closeTimeout: 2_000,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          if (stream.sizeExceeded) return callback(); // answered with 552 by rejectOversized
          const mail: StoredMail = {
            id: `${String(++sequence).padStart(6, "0")}${crypto.randomBytes(3).toString("hex")}`,
            receivedAt: new Date().toISOString(),
            from: parsed.from?.text ?? (session.envelope.mailFrom ? session.envelope.mailFrom.address : ""),
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: parsed.subject ?? "",
            text: parsed.text ?? "",
            html: typeof parsed.html === "string" ? parsed.html : null,
            headers: headerMap(parsed.headerLines),
          };
          // Stored before the reply: a 250 after the data says the server has taken responsibility
          // for the message (RFC 5321 §4.1.1.4), so once the sender has it, the file is there.
          store(dir, mail);
          callback(null, `kept as ${mail.id}`);
        })
        .catch((error: Error) => {
          // RFC 5321 §4.2.2: 451, "local error in processing": the sender may try again.
          const reply = Object.assign(new Error(`could not keep the message: ${error.message}`), { responseCode: 451 });
          callback(reply);
        });
    },
  });
  const host = options.host ?? "127.0.0.1";
  await new Promise<void>((resolve, reject) => {
    const onError = (error: Error) => reject(error);
    server.once("error", onError);
    server.listen(options.port, host, () => {
      server.off("error", onError);
      resolve();
    });
  });
  // A client that drops its connection must not stop the stand-in.
  server.on("error", () => {});
  const address = server.server.address();
  const port = typeof address === "object" && address ? address.port : options.port;
  let closed: Promise<void> | null = null;
  return {
    host,
    port,
    dir,
    close(): Promise<void> {
      closed ??= new Promise<void>((resolve) => server.close(() => resolve()));
      return closed;
    },
  };
}
