import { type RouteConfig, index, route } from "@react-router/dev/routes";

export default [
  index("routes/home.tsx"),
  route("writeups/:slug", "routes/writeup.tsx"),
  route("systems/:slug", "routes/system.tsx"),
  route("search", "routes/search.tsx"),
  route("safety", "routes/safety.tsx"),
  route("api/health", "routes/api.health.ts"),
  route("*", "routes/not-found.tsx"),
] satisfies RouteConfig;
