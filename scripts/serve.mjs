// The production server: the React Router build behind Express, on HOST:PORT (default 127.0.0.1:3000).
// Small on purpose; it exists so that the app can know the client's address (for rate limits).
import path from "node:path";
import { fileURLToPath } from "node:url";
import { createRequestHandler } from "@react-router/express";
import compression from "compression";
import express from "express";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const host = process.env.HOST ?? "127.0.0.1";
const port = Number(process.env.PORT ?? 3000);
// SISTERSHIP_BUILD_DIR: serve a copy of the build kept elsewhere (the benchmarks use one, so that a
// rebuild in the checkout does not change the app under measurement).
const buildDir = path.resolve(process.env.SISTERSHIP_BUILD_DIR ?? path.join(root, "build"));
const build = await import(path.join(buildDir, "server/index.js"));

const app = express();
app.disable("x-powered-by");
app.use(compression());
app.use("/assets", express.static(path.join(buildDir, "client/assets"), { immutable: true, maxAge: "1y" }));
app.use(express.static(path.join(buildDir, "client"), { maxAge: "1h" }));
app.use((req, _res, next) => {
  // The only client address the app trusts is the one this server saw.
  req.headers["x-sistership-client"] = req.socket.remoteAddress ?? "unknown";
  // Whether React Router answers with a page or with the data of a client-side navigation: the app
  // cannot tell once it has normalised the address, and only pages are kept for visitors
  // (app/services/page-cache.server.ts).
  req.headers["x-sistership-document"] = req.path.endsWith(".data") ? "no" : "yes";
  next();
});
app.all("*", createRequestHandler({ build, mode: "production" }));
// Anything the app did not answer (an error thrown outside its error boundaries): a plain 500 or,
// when the database is the cause, a 503 that says so, never a crash.
app.use((error, req, res, _next) => {
  const unavailable = /ECONNREFUSED|terminat|timeout exceeded when trying to connect|57P0[123]/i.test(`${error?.code ?? ""} ${error?.message ?? ""} ${error?.cause?.message ?? ""}`);
  if (!unavailable) console.error(error);
  if (res.headersSent) return res.destroy();
  if (unavailable) res.set("Retry-After", "30");
  res.status(unavailable ? 503 : 500).type("text/plain").send(unavailable ? "The database is not answering; nothing you sent was saved. Try again in a minute." : "Something went wrong on the server.");
});

const server = app.listen(port, host, () => {
  console.log(`[sistership] listening on http://${host}:${port}`);
});
server.on("error", (error) => {
  console.error(error.code === "EADDRINUSE" ? `[sistership] port ${port} on ${host} is busy` : error);
  process.exit(1);
});
// A promise rejected with nobody to catch it (a bug) is logged; the server goes on serving the others.
process.on("unhandledRejection", (reason) => {
  console.error("[sistership] unhandled rejection:", reason);
});
for (const signal of ["SIGINT", "SIGTERM"]) {
  process.on(signal, () => {
    server.close(() => process.exit(0));
    server.closeIdleConnections();
    setTimeout(() => process.exit(0), 3000).unref();
  });
}
