import { Form, Link } from "react-router";
import { deferred } from "./deferred";
import type { SearchBox as TypeAhead } from "./search-box";

type SearchBoxProps = Parameters<typeof TypeAhead>[0];

// The search field is in every page's HTML; its type-ahead's code comes after the page's first
// script (./deferred.tsx): until then it is a plain search field that sends its words to /search.
const SearchBox = deferred(
  () => import("./search-box").then((m) => m.SearchBox),
  ({ id, label, defaultValue, placeholder, inputClassName, labelClassName = "sr-only" }: SearchBoxProps) => (
    <div className="relative min-w-0 flex-1">
      <label htmlFor={id} className={labelClassName}>{label}</label>
      <input id={id} name="q" type="text" inputMode="search" autoComplete="off" spellCheck={false} maxLength={200}
        defaultValue={defaultValue} placeholder={placeholder} className={inputClassName} />
    </div>
  ),
);

export type HeaderUser = { displayName: string; isAdmin: boolean; canReview: boolean } | null;

function AccountLinks({ user }: { user: HeaderUser }) {
  if (!user) {
    return (
      <Link to="/sign-in" className="font-medium text-cloth-50 underline-offset-4 hover:underline">Sign in</Link>
    );
  }
  return (
    <div className="flex items-center gap-4 text-step--1">
      <Link to="/my/writeups" className="text-cloth-100 hover:underline">Your write-ups</Link>
      {user.canReview && <Link to="/review" className="text-cloth-100 hover:underline">Review</Link>}
      {user.isAdmin && <Link to="/admin/users" className="text-cloth-100 hover:underline">Members</Link>}
      <Link to="/account" className="font-medium text-cloth-50 hover:underline">{user.displayName}</Link>
      <Form method="post" action="/sign-out">
        <button type="submit" className="text-cloth-100 underline-offset-4 hover:underline">Sign out</button>
      </Form>
    </div>
  );
}

export function SiteHeader({ className, query, user }: { className: string; query: string; user: HeaderUser }) {
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
        <nav aria-label="Spaces and the fit check" className="flex gap-4 text-step--1 font-medium">
          <Link to="/spaces" className="text-cloth-50 underline-offset-4 hover:underline">Spaces</Link>
          <Link to="/fit" className="text-cloth-50 underline-offset-4 hover:underline">Will it fit?</Link>
        </nav>
        <nav aria-label="Calculators" className="flex gap-4 text-step--1 font-medium">
          <Link to="/tools/heel" className="text-cloth-50 underline-offset-4 hover:underline">Heel</Link>
          <Link to="/tools/cable" className="text-cloth-50 underline-offset-4 hover:underline">Cable sizes</Link>
        </nav>
        <Form method="get" action="/search" role="search" className="ml-auto flex w-full max-w-sm gap-2 sm:w-auto">
          <SearchBox
            key={query}
            id="site-search"
            label="Search write-ups, spaces and items"
            defaultValue={query}
            placeholder="e.g. battery box under the settee"
            inputClassName="w-full rounded-md border border-deep-500 bg-deep-900/40 px-3 py-2 text-cloth-50 placeholder:italic placeholder:text-deep-200"
            listClassName="sm:left-auto sm:w-[28rem]"
          />
          <button type="submit" className="rounded-md bg-varnish-500 px-3 py-2 font-medium text-deep-900 hover:bg-varnish-400">
            Search
          </button>
        </Form>
        <AccountLinks user={user} />
      </div>
    </header>
  );
}

export function SiteFooter() {
  return (
    <footer className="no-print mt-12 border-t border-cloth-200 bg-cloth-100">
      <div className="mx-auto flex max-w-5xl flex-wrap items-center justify-between gap-4 px-4 py-6 text-step--1 text-ink-soft sm:px-6">
        <p>Written by owners, for owners. Reviewed by volunteer moderators before publication.</p>
        <nav aria-label="More" className="flex flex-wrap gap-x-5 gap-y-2">
          <Link to="/digest" className="font-medium text-bootstripe-600">The yearly digests</Link>
          <Link to="/safety" className="font-medium text-bootstripe-600">Safety and the limits of this advice</Link>
        </nav>
      </div>
    </footer>
  );
}
