// The e-mails an account receives. Each is written to the outbox (sent in the background).
import type { DbOrTx } from "./outbox.server";
import { enqueueEmail } from "./outbox.server";
import { TOKEN_LIFETIME_MINUTES } from "./tokens.server";

export async function queueVerificationEmail(db: DbOrTx, to: string, name: string, link: string) {
  const hours = TOKEN_LIFETIME_MINUTES.verify_email / 60;
  return enqueueEmail(db, {
    to,
    kind: "verify_email",
    subject: "Confirm your e-mail address for Sistership",
    text:
      `Hello ${name},\n\nPlease confirm that this is your e-mail address by opening this link within ${hours} hours:\n\n${link}\n\n` +
      "Once it is confirmed you can register your boat, add measurements and write up your work.\n\n" +
      "If you did not sign up for Sistership, you can ignore this message.\n",
  });
}

export async function queueResetEmail(db: DbOrTx, to: string, name: string, link: string) {
  return enqueueEmail(db, {
    to,
    kind: "reset_password",
    subject: "Choose a new Sistership password",
    text:
      `Hello ${name},\n\nSomeone (we hope you) asked to reset the password of your Sistership account. ` +
      `Open this link within ${TOKEN_LIFETIME_MINUTES.reset_password} minutes to choose a new one; it works once:\n\n${link}\n\n` +
      "If you did not ask for this, ignore this message: your password stays as it is.\n",
  });
}
