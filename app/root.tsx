import {
  isRouteErrorResponse, Link, Links, Meta, Outlet, Scripts, ScrollRestoration, useRouteLoaderData,
} from "react-router";
import type { Route } from "./+types/root";
import "./app.css";
import { DatabaseOutagePage } from "./components/db-outage";
import { useNonce } from "./components/nonce";
import { SiteFooter, SiteHeader } from "./components/site-chrome";
import { databaseOutageFrom } from "./domain/db-outage";
import { CLASS_NAME } from "./domain/hulls";
import { can } from "./domain/permissions";
import { databaseOutage } from "./services/db-outage.server";
import { refuseUnreadableAddress } from "./services/form-body.server";
import { originCheck } from "./services/origin-check.server";
import { forgetPagesAfterWrites } from "./services/page-cache.server";
import { getUser } from "./services/session.server";

export const middleware: Route.MiddlewareFunction[] = [originCheck, refuseUnreadableAddress, databaseOutage, forgetPagesAfterWrites];

export async function loader({ request }: Route.LoaderArgs) {
  const url = new URL(request.url);
  const user = await getUser(request);
  return {
    className: CLASS_NAME,
    query: url.pathname === "/search" ? (url.searchParams.get("q") ?? "") : "",
    user: user ? { displayName: user.displayName, isAdmin: user.roles.includes("admin"), canReview: can(user.roles, "writeup:review"), canCompile: can(user.roles, "digest:compile") } : null,
  };
}

export function Layout({ children }: { children: React.ReactNode }) {
  const data = useRouteLoaderData<typeof loader>("root");
  const nonce = useNonce();
  return (
    <html lang="en">
      <head>
        <meta charSet="utf-8" />
        <meta name="viewport" content="width=device-width, initial-scale=1" />
        <link rel="icon" href="/favicon.svg" type="image/svg+xml" />
        <Meta />
        <Links />
      </head>
      <body>
        <SiteHeader className={data?.className ?? CLASS_NAME} query={data?.query ?? ""} user={data?.user ?? null} />
        {data?.user?.canCompile && (
          <nav aria-label="Class secretary" className="no-print border-b border-deep-100 bg-deep-50">
            <div className="mx-auto flex max-w-5xl items-center gap-4 px-4 py-1.5 text-step--1 sm:px-6">
              <span className="text-ink-soft">Class secretary</span>
              <Link to="/secretary/digest" className="font-medium">Yearly digest</Link>
              <Link to="/digest" className="text-ink-soft">Archive</Link>
            </div>
          </nav>
        )}
        <main id="main" className="mx-auto w-full max-w-5xl flex-1 px-4 py-8 sm:px-6">
          {children}
        </main>
        <SiteFooter />
        <ScrollRestoration nonce={nonce} />
        <Scripts nonce={nonce} />
      </body>
    </html>
  );
}

export default function App() {
  return <Outlet />;
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  const outage = isRouteErrorResponse(error) && error.status === 503 ? databaseOutageFrom(error.data) : null;
  if (outage) return <DatabaseOutagePage outage={outage} />;
  let title = "Something went wrong";
  let detail = "The page could not be shown. Try again in a moment; if it keeps happening, tell the class moderators.";
  if (isRouteErrorResponse(error)) {
    if (error.status === 404) {
      title = "Page not found";
      detail = "There is nothing at this address. The write-up may have been withdrawn, or the link mistyped.";
    } else if (error.status === 403) {
      title = "Not for your account";
      detail = typeof error.data === "string" ? error.data : "Your account does not have the role this page needs.";
    } else if (error.status === 503) {
      title = "Back in a moment";
      detail = "Sistership cannot reach its database just now. Nothing you saved is lost; try again shortly.";
    } else {
      title = `${error.status} ${error.statusText}`;
      detail = typeof error.data === "string" ? error.data : detail;
    }
  } else if (import.meta.env.DEV && error instanceof Error) {
    detail = error.stack ?? error.message;
  }
  return (
    <section className="mx-auto max-w-2xl py-12">
      <title>{`${title} · Sistership`}</title>
      <h1 className="text-step-3 font-semibold">{title}</h1>
      <p className="mt-4 whitespace-pre-wrap text-ink-soft">{detail}</p>
      <p className="mt-8">
        <Link to="/" className="font-medium">Back to the home page</Link>
      </p>
    </section>
  );
}
