// The calculators attached to a write-up (a weight move, a cable run), each worked out again by the
// same code as the boat page and the tools. Rows come from listWriteupCalculations (models/calculations.server.ts).
import { CableRunResult } from "~/components/cable-run-result";
import { WeightMoveResult } from "~/components/weight-move-result";
import type { Calculation } from "~/domain/calculations";
import type { LengthUnit } from "~/domain/units";

export type ShownCalculation = Calculation & { id: number; title: string };

export function WriteupCalculations({ calculations, unit }: { calculations: readonly ShownCalculation[]; unit: LengthUnit }) {
  if (!calculations.length) return null;
  return (
    <section aria-labelledby="calculations-heading" className="mt-10 space-y-4" id="calculations">
      <h2 id="calculations-heading" className="text-step-2 font-semibold">The numbers</h2>
      <p className="text-step--1 text-ink-soft">Worked out by Sistership from the author's figures; estimates, with the sources named.</p>
      {calculations.map((c) =>
        c.kind === "weight-move" ? (
          <WeightMoveResult key={c.id} input={c.input} unit={unit} title={c.title} />
        ) : (
          <CableRunResult key={c.id} input={c.input} unit={unit} title={c.title} />
        ),
      )}
    </section>
  );
}
