// Security headers for every response (OWASP Secure Headers Project recommendations).
import { randomBytes } from "node:crypto";

export function createNonce(): string {
  return randomBytes(16).toString("base64");
}

export function contentSecurityPolicy(nonce: string | null): string {
  return [
    "default-src 'self'",
    // No inline script without the request's nonce; no eval.
    nonce ? `script-src 'self' 'nonce-${nonce}'` : "script-src 'self'",
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self' data:", // Vite inlines the smallest font files as data: URLs
    "connect-src 'self'",
    "form-action 'self'",
    "base-uri 'self'",
    "object-src 'none'",
    "frame-ancestors 'none'",
  ].join("; ");
}

export function applySecurityHeaders(headers: Headers, nonce: string | null, production: boolean) {
  // The development server injects its own inline scripts for hot reload: CSP is enforced in production.
  if (production) headers.set("Content-Security-Policy", contentSecurityPolicy(nonce));
  else headers.set("Content-Security-Policy", "frame-ancestors 'none'");
  headers.set("X-Frame-Options", "DENY");
  headers.set("Referrer-Policy", "strict-origin-when-cross-origin");
  headers.set("X-Content-Type-Options", "nosniff");
  headers.set("Cross-Origin-Opener-Policy", "same-origin");
  headers.set("Permissions-Policy", "camera=(self), geolocation=(), microphone=()");
}
