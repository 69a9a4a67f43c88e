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
const build = await import(path.join(root, "build/server/index.js"));

const app = express();
app.disable("x-powered-by");
app.use(compression());
app.use("/assets", express.static(path.join(root, "build/client/assets"), { immutable: true, maxAge: "1y" }));
app.use(express.static(path.join(root, "build/client"), { maxAge: "1h" }));
app.use((req, _res, next) => {
  // The only client address the app trusts is the one this server saw.
  req.headers["x-sistership-client"] = req.socket.remoteAddress ?? "unknown";
  next();
});
app.all("*", createRequestHandler({ build, mode: "production" }));

const server = app.listen(port, host, () => {
  console.log(`[sistership] listening on http://${host}:${port}`);
});
server.on("error", (error) => {
  console.error(error.code === "EADDRINUSE" ? `[sistership] port ${port} on ${host} is busy` : error);
  process.exit(1);
});
for (const signal of ["SIGINT", "SIGTERM"]) {
  process.on(signal, () => {
    server.close(() => process.exit(0));
    server.closeIdleConnections();
    setTimeout(() => process.exit(0), 3000).unref();
  });
}
