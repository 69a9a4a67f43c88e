// The calculators attached to a write-up (a weight move, a cable run), each worked out again by the
// same code as the boat page and the tools. Rows come from models/calculations.server.ts: the
// published revision's set on the write-up page, a revision's own set on the review page.
import { CableRunResult } from "~/components/cable-run-result";
import { WeightMoveResult } from "~/components/weight-move-result";
import type { Calculation } from "~/domain/calculations";
import type { LengthUnit } from "~/domain/units";

export type ShownCalculation = Calculation & { id: number; title: string };

/** What a reader would call one set of numbers when it has no title of its own. */
export function calculationName(c: ShownCalculation): string {
  if (c.title) return c.title;
  return c.kind === "cable-run" ? (c.input.label || "A cable run") : "A weight move";
}

export function WriteupCalculations({ calculations, unit, added, intro }: {
  calculations: readonly ShownCalculation[];
  unit: LengthUnit;
  /** On the review page: the ids the published revision does not have, marked as new. */
  added?: readonly number[];
  intro?: string;
}) {
  if (!calculations.length) return null;
  return (
    <section aria-labelledby="calculations-heading" className="mt-10 space-y-4" id="calculations">
      <h2 id="calculations-heading" className="text-step-2 font-semibold">The numbers</h2>
      <p className="text-step--1 text-ink-soft">{intro ?? "Worked out by Sistership from the author's figures; estimates, with the sources named."}</p>
      {calculations.map((c) => {
        const result = c.kind === "weight-move"
          ? <WeightMoveResult input={c.input} unit={unit} title={c.title} />
          : <CableRunResult input={c.input} unit={unit} title={c.title} />;
        return added?.includes(c.id) ? (
          <div key={c.id} className="border-l-4 border-deep-500 pl-3">
            <p className="text-step--1 font-medium text-deep-800">New in this revision</p>
            {result}
          </div>
        ) : <div key={c.id}>{result}</div>;
      })}
    </section>
  );
}
