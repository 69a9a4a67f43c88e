// Cross-site request forgery guard: a request that changes state (any method but GET/HEAD/OPTIONS)
// must come from our own pages. Browsers send Origin on such requests (Fetch standard; OWASP CSRF
// Prevention Cheat Sheet, "Verifying origin with standard headers").
import { data } from "react-router";

const SAFE = new Set(["GET", "HEAD", "OPTIONS"]);

export function crossSiteReason(request: Request): string | null {
  if (SAFE.has(request.method.toUpperCase())) return null;
  const own = new URL(request.url).origin;
  const origin = request.headers.get("origin");
  if (origin && origin !== "null" && origin !== own) return `requests from ${origin} are not accepted`;
  if (origin === "null") return "requests from an opaque origin are not accepted";
  if (request.headers.get("sec-fetch-site") === "cross-site") return "cross-site requests are not accepted";
  return null;
}

export async function originCheck({ request }: { request: Request }, next: () => Promise<Response>): Promise<Response> {
  const reason = crossSiteReason(request);
  if (reason) throw data(`This form was sent from another site, so it was refused (${reason}).`, { status: 403 });
  return next();
}
