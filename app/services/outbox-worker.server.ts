// The app's outbox sender: every ~2 s (and soon after kickOutbox()) it delivers the due messages of
// the outbox. One per process; it never throws out of its loop, and its timers do not keep the
// process alive. Several processes may run one each: deliverPending() never lets two of them
// send the same message.
import { db } from "~/db/index.server";
import { deliverPending } from "~/models/outbox.server";
import { sendMail } from "~/services/email.server";

const POLL_MS = 2_000;
const KICK_MS = 50;
const BATCH = 20;
const WARN_EVERY_MS = 60_000;

type Worker = {
  timer: NodeJS.Timeout | null;
  running: boolean;
  again: boolean;
  stopped: boolean;
  lastWarning: { text: string; at: number } | null;
};

// On globalThis, so that the development server's module reloads do not start a second one.
const g = globalThis as unknown as { __sistershipOutboxWorker?: Worker };

function warn(worker: Worker, text: string) {
  // A server that stays down would otherwise repeat the same line every poll.
  const now = Date.now();
  if (worker.lastWarning?.text === text && now - worker.lastWarning.at < WARN_EVERY_MS) return;
  worker.lastWarning = { text, at: now };
  console.warn(`[outbox] ${text}`);
}

function schedule(worker: Worker, ms: number) {
  if (worker.stopped) return;
  if (worker.timer) clearTimeout(worker.timer);
  worker.timer = setTimeout(() => void tick(worker), ms);
  worker.timer.unref();
}

async function tick(worker: Worker) {
  worker.timer = null;
  if (worker.running) {
    worker.again = true;
    return;
  }
  worker.running = true;
  worker.again = false;
  try {
    // A full batch means more may be due: carry on until the outbox is drained.
    for (;;) {
      const { sent, failed } = await deliverPending(db, sendMail, { limit: BATCH });
      if (failed) warn(worker, `${failed} message(s) could not be sent; they will be retried`);
      if (sent + failed < BATCH || worker.stopped) break;
    }
  } catch (error) {
    warn(worker, `the sender could not read or update the outbox: ${error instanceof Error ? error.message : String(error)}`);
  } finally {
    worker.running = false;
    schedule(worker, worker.again ? 0 : POLL_MS);
  }
}

/** Starts the sender once per process; later calls do nothing. */
export function startOutboxWorker(): void {
  if (g.__sistershipOutboxWorker && !g.__sistershipOutboxWorker.stopped) return;
  const worker: Worker = { timer: null, running: false, again: false, stopped: false, lastWarning: null };
  g.__sistershipOutboxWorker = worker;
  schedule(worker, KICK_MS);
}

/** Asks the sender to run soon, e.g. right after a write that enqueued a message has committed. */
export function kickOutbox(): void {
  const worker = g.__sistershipOutboxWorker;
  if (!worker || worker.stopped) return;
  if (worker.running) worker.again = true;
  else schedule(worker, KICK_MS);
}

/** Stops the sender after the message it may be sending. */
export function stopOutboxWorker(): void {
  const worker = g.__sistershipOutboxWorker;
  if (!worker) return;
  worker.stopped = true;
  if (worker.timer) clearTimeout(worker.timer);
  worker.timer = null;
}
