import { Link } from "react-router";
import type { Caution } from "~/domain/cautions";

/**
 * `about`: what the cautions stand beside, for the closing line: a member's write-up ("account",
 * the default) or one of the product's own calculations ("figures").
 */
export function CautionList({ cautions, about = "account" }: { cautions: Caution[]; about?: "account" | "figures" }) {
  if (!cautions.length) return null;
  return (
    <aside aria-labelledby="cautions-heading" className="rounded-lg border-l-4 border-bootstripe-600 bg-bootstripe-50 p-5">
      <h2 id="cautions-heading" className="font-sans text-step-0 font-semibold text-bootstripe-800">Before you start</h2>
      <ul className="mt-3 space-y-3">
        {cautions.map((c) => (
          <li key={c.key}>
            <p><strong>{c.title}.</strong> {c.text}</p>
            <p className="text-step--1 text-ink-soft">Source: {c.source}</p>
          </li>
        ))}
      </ul>
      <p className="mt-4 text-step--1">
        {about === "account"
          ? "This is one owner's account, not professional advice."
          : "These figures are estimates from the measurements members entered, not professional advice."}{" "}
        <Link to="/safety">Read how to use it safely</Link>.
      </p>
    </aside>
  );
}
