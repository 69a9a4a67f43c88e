import { type RouteConfig, index, route } from "@react-router/dev/routes";

export default [
  index("routes/home.tsx"),
  route("writeups/:slug", "routes/writeup.tsx"),
  route("systems/:slug", "routes/system.tsx"),
  route("search", "routes/search.tsx"),
  route("api/search", "routes/api.search.ts"),
  route("api/search/suggest", "routes/api.search.suggest.ts"),
  route("safety", "routes/safety.tsx"),
  route("api/health", "routes/api.health.ts"),

  // Accounts
  route("sign-in", "routes/sign-in.tsx"),
  route("sign-up", "routes/sign-up.tsx"),
  route("sign-out", "routes/sign-out.tsx"),
  route("verify-email", "routes/verify-email.tsx"),
  route("forgot-password", "routes/forgot-password.tsx"),
  route("reset-password", "routes/reset-password.tsx"),
  route("account", "routes/account.tsx"),
  route("admin/users", "routes/admin.users.tsx"),
  route("dev/mail", "routes/dev.mail.tsx"),

  // Writing and reviewing
  route("my/writeups", "routes/my.writeups.tsx"),
  route("my/writeups/:id", "routes/my.writeups.$id.tsx"),
  route("review", "routes/review.tsx"),
  route("review/:revisionId", "routes/review.$revisionId.tsx"),
  route("api/preview", "routes/api.preview.ts"),
  route("api/photos", "routes/api.photos.ts"),

  // Photos
  route("media/*", "routes/media.$.ts"),

  // Conversation on write-ups
  route("api/writeups/:slug/comments", "routes/api.writeups.$slug.comments.ts"),
  route("api/writeups/:slug/done-too", "routes/api.writeups.$slug.done-too.ts"),
  route("admin/tags", "routes/admin.tags.tsx"),

  // Spaces and the fit check
  route("spaces", "routes/spaces.tsx"),
  route("spaces/:slug", "routes/space.tsx"),
  route("fit", "routes/fit.tsx"),
  route("items", "routes/items.tsx"),
  route("api/fit", "routes/api.fit.ts"),
  route("api/fit/check", "routes/api.fit.check.ts"),
  route("api/spaces", "routes/api.spaces.ts"),
  route("api/spaces/:id", "routes/api.space.ts"),

  // Boats: weight ledger, heel and trim, cable runs
  route("boats/:hull", "routes/boat.tsx"),
  route("admin/class", "routes/admin.class.tsx"),
  route("tools/heel", "routes/tools.heel.tsx"),
  route("tools/cable", "routes/tools.cable.tsx"),
  route("api/heel", "routes/api.heel.ts"),
  route("api/cable", "routes/api.cable.ts"),

  // The yearly digest: the public archive, the unsubscribe link, and the secretary's pages
  route("digest", "routes/digest.tsx"),
  route("digest/unsubscribe", "routes/digest.unsubscribe.tsx"),
  route("digest/:year", "routes/digest.$year.tsx"),
  route("digest/:year/pdf", "routes/digest.$year.pdf.ts"),
  route("secretary/digest", "routes/secretary.digest.tsx"),
  route("secretary/digest/:year", "routes/secretary.digest.$year.tsx"),
  route("secretary/digest/:year/preview", "routes/secretary.digest.$year.preview.tsx"),

  route("*", "routes/not-found.tsx"),
] satisfies RouteConfig;
