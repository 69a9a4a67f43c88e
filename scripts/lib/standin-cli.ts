// What the stand-in programs (mail, photo store) share: reading `--name value` options, a checked
// port, a clean stop on SIGTERM or Ctrl-C with a short grace for open connections, and a clear
// message when the port is busy.

export function option(name: string): string | undefined {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? process.argv[i + 1] : undefined;
}

type Running = { close(): Promise<unknown> };

/**
 * Starts a stand-in and keeps it running until the process is told to stop. `label` names it in
 * messages ("mail stand-in"); `busyHint` says how to choose another port.
 */
export async function runStandin<T extends Running>(options: {
  label: string;
  port: number;
  start: () => Promise<T>;
  started: (standin: T) => string;
  busyHint: (port: number) => string;
}): Promise<void> {
  const { label, port } = options;
  if (!Number.isInteger(port) || port < 0 || port > 65535) {
    console.error(`[sistership] ${label}: ${port} is not a port number`);
    process.exit(1);
  }
  try {
    const standin = await options.start();
    console.log(`[sistership] ${label}: ${options.started(standin)}`);
    let stopping = false;
    const stop = () => {
      if (stopping) return;
      stopping = true;
      // Connections still open get a short grace, then the process ends regardless.
      setTimeout(() => process.exit(0), 3_000).unref();
      void standin.close().then(() => process.exit(0));
    };
    process.on("SIGTERM", stop);
    process.on("SIGINT", stop);
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    console.error(
      code === "EADDRINUSE"
        ? `[sistership] ${label}: port ${port} on 127.0.0.1 is busy. Stop what uses it, or choose another: ${options.busyHint(port)}`
        : `[sistership] ${label} could not start: ${(error as Error).message}`,
    );
    process.exit(1);
  }
}
