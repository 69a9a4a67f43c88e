import { PassThrough } from "node:stream";
import { createReadableStreamFromReadable } from "@react-router/node";
import { isbot } from "isbot";
import type { RenderToPipeableStreamOptions } from "react-dom/server";
import { renderToPipeableStream } from "react-dom/server";
import { type EntryContext, type HandleDataRequestFunction, type HandleErrorFunction, isRouteErrorResponse, ServerRouter } from "react-router";
import { NonceContext } from "./components/nonce";
import { noteIfDatabaseUnavailable } from "./db/client.server";
import { RETRY_AFTER_SECONDS } from "./services/db-outage.server";
import { env } from "./services/env.server";
import { startOutboxWorker } from "./services/outbox-worker.server";
import { applySecurityHeaders, createNonce } from "./services/security-headers.server";

export const streamTimeout = 5_000;
const production = env.NODE_ENV === "production";

// Mail written to the outbox is sent in the background by this process.
if (env.NODE_ENV !== "test") startOutboxWorker();

export default function handleRequest(
  request: Request,
  responseStatusCode: number,
  responseHeaders: Headers,
  routerContext: EntryContext,
) {
  const nonce = createNonce();
  applySecurityHeaders(responseHeaders, nonce, production);
  if (responseStatusCode === 503) responseHeaders.set("Retry-After", String(RETRY_AFTER_SECONDS));
  if (request.method.toUpperCase() === "HEAD") {
    return new Response(null, { status: responseStatusCode, headers: responseHeaders });
  }
  return new Promise<Response>((resolve, reject) => {
    let shellRendered = false;
    const userAgent = request.headers.get("user-agent");
    const readyOption: keyof RenderToPipeableStreamOptions =
      (userAgent && isbot(userAgent)) || routerContext.isSpaMode ? "onAllReady" : "onShellReady";
    let timeoutId: ReturnType<typeof setTimeout> | undefined = setTimeout(() => abort(), streamTimeout + 1000);

    const { pipe, abort } = renderToPipeableStream(
      <NonceContext.Provider value={nonce}>
        <ServerRouter context={routerContext} url={request.url} nonce={nonce} />
      </NonceContext.Provider>,
      {
        nonce,
        // A Suspense boundary's content goes into the HTML where it stands, however long the page:
        // React would otherwise send a large one after the rest, hidden until a script of its own
        // moves it in place, and a reader without JavaScript would see only its fallback
        // (components/deferred.tsx renders parts of pages inside such boundaries).
        progressiveChunkSize: Number.POSITIVE_INFINITY,
        [readyOption]() {
          shellRendered = true;
          const body = new PassThrough({
            final(callback) {
              clearTimeout(timeoutId);
              timeoutId = undefined;
              callback();
            },
          });
          responseHeaders.set("Content-Type", "text/html; charset=utf-8");
          pipe(body);
          resolve(new Response(createReadableStreamFromReadable(body), { headers: responseHeaders, status: responseStatusCode }));
        },
        onShellError(error: unknown) {
          reject(error);
        },
        onError(error: unknown) {
          responseStatusCode = 500;
          if (shellRendered) console.error(error);
        },
      },
    );
  });
}

export const handleDataRequest: HandleDataRequestFunction = (response) => {
  applySecurityHeaders(response.headers, null, production);
  if (response.status === 503) response.headers.set("Retry-After", String(RETRY_AFTER_SECONDS));
  return response;
};

// Errors the routes did not handle. A database that cannot be reached is answered with a 503 page
// (app/services/db-outage.server.ts) and logged once by the pool, not once per request here.
export const handleError: HandleErrorFunction = (error, { request }) => {
  const cause = isRouteErrorResponse(error) && (error as { error?: unknown }).error ? (error as { error?: unknown }).error : error;
  if (noteIfDatabaseUnavailable(cause) || request.signal.aborted) return;
  console.error(cause);
};
