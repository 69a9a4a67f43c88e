// The search box with type-ahead: an editable combobox with a list of suggestions (the ARIA
// Authoring Practices' "combobox with listbox popup" pattern). Without JavaScript it is a plain
// text field in a GET form to /search. With it, suggestions come from GET /api/search/suggest
// through a fetcher as the reader types: Down and Up move through them, Enter opens the one
// chosen (or searches for the words when none is), Escape closes the list (and, pressed again,
// clears the field), Tab leaves as usual.
import { useEffect, useId, useRef, useState } from "react";
import { useFetcher, useNavigate } from "react-router";

type Suggestion = { type: "writeup" | "system" | "zone" | "space" | "item"; label: string; url: string };
type SuggestAnswer = { q: string; suggestions: Suggestion[] };

const KIND_WORD: Record<Suggestion["type"], string> = {
  writeup: "Write-up",
  system: "System",
  zone: "Zone",
  space: "Space",
  item: "Item",
};

const DELAY_MS = 150;

export function SearchBox({
  id, label, defaultValue, placeholder, inputClassName, listClassName = "", labelClassName = "sr-only",
}: {
  id: string;
  label: string;
  defaultValue: string;
  placeholder?: string;
  inputClassName: string;
  listClassName?: string;
  labelClassName?: string;
}) {
  const fetcher = useFetcher<SuggestAnswer>();
  const navigate = useNavigate();
  const [value, setValue] = useState(defaultValue);
  const [open, setOpen] = useState(false);
  const [active, setActive] = useState(-1);
  const [hydrated, setHydrated] = useState(false);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const field = useRef<HTMLInputElement>(null);
  const listId = `${id}-suggestions`;
  const statusId = useId();

  useEffect(() => {
    setHydrated(true);
    // Words typed while the field was still the page's plain one (before this script came, which
    // in the site's header is after the page's first script) stay in it.
    const typed = field.current?.value;
    if (typed !== undefined) setValue(typed);
  }, []);
  useEffect(() => () => { if (timer.current) clearTimeout(timer.current); }, []);

  // Suggestions for what is in the field now (an answer to older typing is not shown).
  const answer = fetcher.data && fetcher.data.q === value ? fetcher.data.suggestions : [];
  const expanded = open && answer.length > 0;

  function ask(text: string) {
    if (timer.current) clearTimeout(timer.current);
    if (text.trim().length < 2) return;
    timer.current = setTimeout(() => fetcher.load(`/api/search/suggest?q=${encodeURIComponent(text)}`), DELAY_MS);
  }

  function choose(s: Suggestion) {
    setOpen(false);
    setActive(-1);
    navigate(s.url);
  }

  function onKeyDown(e: React.KeyboardEvent<HTMLInputElement>) {
    if (e.key === "ArrowDown") {
      e.preventDefault();
      if (!open) {
        setOpen(true);
        if (!answer.length) ask(value);
        if (e.altKey) return;
      }
      if (answer.length) setActive((i) => (i + 1 >= answer.length ? 0 : i + 1));
    } else if (e.key === "ArrowUp") {
      e.preventDefault();
      if (!open) setOpen(true);
      if (answer.length) setActive((i) => (i <= 0 ? answer.length - 1 : i - 1));
    } else if (e.key === "Enter") {
      if (expanded && active >= 0 && answer[active]) {
        e.preventDefault();
        choose(answer[active]);
      } else {
        setOpen(false);
      }
    } else if (e.key === "Escape") {
      if (expanded) {
        e.preventDefault();
        setOpen(false);
        setActive(-1);
      } else if (value) {
        e.preventDefault();
        setValue("");
      }
    } else if (e.key === "Tab") {
      setOpen(false);
      setActive(-1);
    }
  }

  const activeId = expanded && active >= 0 ? `${listId}-${active}` : undefined;
  return (
    <div className="relative min-w-0 flex-1">
      <label htmlFor={id} className={labelClassName}>{label}</label>
      <input
        ref={field}
        id={id}
        name="q"
        type="text"
        inputMode="search"
        autoComplete="off"
        spellCheck={false}
        maxLength={200}
        value={value}
        placeholder={placeholder}
        className={inputClassName}
        {...(hydrated
          ? {
              role: "combobox",
              "aria-autocomplete": "list" as const,
              "aria-expanded": expanded,
              "aria-controls": listId,
              "aria-activedescendant": activeId,
              "aria-describedby": statusId,
            }
          : {})}
        onChange={(e) => {
          setValue(e.target.value);
          setActive(-1);
          setOpen(true);
          ask(e.target.value);
        }}
        onKeyDown={onKeyDown}
        onBlur={() => {
          setOpen(false);
          setActive(-1);
        }}
      />
      {hydrated && (
        <>
          <ul
            id={listId}
            role="listbox"
            aria-label="Suggestions"
            hidden={!expanded}
            className={
              "absolute left-0 right-0 top-full z-20 mt-1 max-h-96 overflow-y-auto rounded-md border border-cloth-300 bg-cloth-50 py-1 text-ink shadow-lg " +
              listClassName
            }
          >
            {answer.map((s, i) => (
              <li
                key={`${s.type}-${s.url}`}
                id={`${listId}-${i}`}
                role="option"
                aria-selected={i === active}
                // Keep the focus in the field while the pointer chooses.
                onMouseDown={(e) => e.preventDefault()}
                onClick={() => choose(s)}
                className={
                  "flex cursor-pointer items-baseline gap-2 px-3 py-2 text-step--1 " +
                  (i === active ? "bg-deep-700 text-cloth-50" : "hover:bg-cloth-100")
                }
              >
                <span className={"w-16 shrink-0 text-[0.75rem] uppercase tracking-wide " + (i === active ? "text-deep-100" : "text-ink-soft")}>
                  {KIND_WORD[s.type]}
                </span>
                <span className="min-w-0">{s.label}</span>
              </li>
            ))}
          </ul>
          <span id={statusId} role="status" className="sr-only">
            {expanded ? `${answer.length} suggestion${answer.length === 1 ? "" : "s"}; use the up and down arrows to choose, Enter to open.` : ""}
          </span>
        </>
      )}
    </div>
  );
}
