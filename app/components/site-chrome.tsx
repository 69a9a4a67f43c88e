import { Form, Link } from "react-router";

export function SiteHeader({ className, query }: { className: string; query: string }) {
  return (
    <header className="no-print bg-deep-800 text-cloth-50">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:m-2 focus:bg-cloth-50 focus:p-2 focus:text-deep-900">
        Skip to content
      </a>
      <div className="mx-auto flex max-w-5xl flex-wrap items-center gap-x-6 gap-y-3 px-4 py-4 sm:px-6">
        <Link to="/" className="group flex items-baseline gap-2 text-cloth-50 no-underline">
          <span className="font-serif text-step-2 font-semibold tracking-tight">Sistership</span>
          <span className="text-step--1 text-deep-200 group-hover:text-cloth-100">{className} owners' knowledge base</span>
        </Link>
        <Form method="get" action="/search" role="search" className="ml-auto flex w-full max-w-sm gap-2 sm:w-auto">
          <label htmlFor="site-search" className="sr-only">Search write-ups</label>
          <input
            id="site-search"
            name="q"
            type="search"
            defaultValue={query}
            placeholder="battery box under the settee"
            className="min-w-0 flex-1 rounded-md border border-deep-500 bg-deep-900/40 px-3 py-2 text-cloth-50 placeholder:text-deep-200"
          />
          <button type="submit" className="rounded-md bg-varnish-500 px-3 py-2 font-medium text-deep-900 hover:bg-varnish-400">
            Search
          </button>
        </Form>
      </div>
    </header>
  );
}

export function SiteFooter() {
  return (
    <footer className="no-print mt-12 border-t border-cloth-200 bg-cloth-100">
      <div className="mx-auto flex max-w-5xl flex-wrap items-center justify-between gap-4 px-4 py-6 text-step--1 text-ink-soft sm:px-6">
        <p>Written by owners, for owners. Reviewed by volunteer moderators before publication.</p>
        <Link to="/safety" className="font-medium text-bootstripe-600">Safety and the limits of this advice</Link>
      </div>
    </footer>
  );
}
