// Outgoing e-mail over SMTP (nodemailer). Only the outbox sender calls this: everything else
// writes to the outbox with enqueueEmail() (app/models/outbox.server.ts), so a write never
// waits for, or fails because of, the SMTP server.
import nodemailer from "nodemailer";
import { env } from "~/services/env.server";

export type OutgoingMail = {
  to: string;
  subject: string;
  text: string;
  html?: string | null;
  /** Extra header fields, e.g. List-Unsubscribe on the digest. */
  headers?: Record<string, string>;
};

/** What a sender needs; sendMail() below is the app's, tests make their own with createMailSender(). */
export type SendMail = (mail: OutgoingMail) => Promise<{ messageId: string }>;

export function isLoopbackHost(host: string): boolean {
  return host === "localhost" || host === "::1" || /^127\.\d{1,3}\.\d{1,3}\.\d{1,3}$/.test(host);
}

export function createMailSender(options: { host: string; port: number; from: string }): SendMail {
  const loopback = isLoopbackHost(options.host);
  const transport = nodemailer.createTransport({
    host: options.host,
    port: options.port,
    secure: false,
    // On loopback (the local stand-in) there is nothing to encrypt against. Towards a real relay,
    // refuse to send reset and verification links in clear: STARTTLS is required (RFC 3207).
    ignoreTLS: loopback,
    requireTLS: !loopback,
    // Fail fast when the server is down or silent; the outbox retries later.
    connectionTimeout: 5_000,
    greetingTimeout: 5_000,
    socketTimeout: 30_000,
    dnsTimeout: 5_000,
  });
  return async (mail) => {
    const info = await transport.sendMail({
      from: options.from,
      to: mail.to,
      subject: mail.subject,
      text: mail.text,
      html: mail.html ?? undefined,
      headers: mail.headers,
    });
    return { messageId: info.messageId };
  };
}

let appSender: SendMail | undefined;

/** Sends one message through SMTP_HOST:SMTP_PORT. Used only by the outbox sender. */
export const sendMail: SendMail = (mail) => {
  appSender ??= createMailSender({ host: env.SMTP_HOST, port: env.SMTP_PORT, from: env.MAIL_FROM });
  return appSender(mail);
};
