// A weight move and what it does to heel and trim: before and after, in words and numbers, with
// the section and the plan drawn after the move. Used on the boat page (what if) and on a
// write-up that carries a weight-move calculation (app/domain/calculations.ts).
import type { ReactNode } from "react";
import { PlanDrawing, SectionDrawing, WeightKey } from "~/components/boat-drawings";
import { computeWeightMove } from "~/domain/calculation-results";
import type { WeightMoveInput } from "~/domain/calculations";
import {
  describeDraftChange,
  describeHeel,
  describeOffset,
  describePosition,
  describeTrim,
  formatGm,
  formatMct1,
  formatMoment,
  formatPounds,
  weightUnitFor,
} from "~/domain/ledger";
import { SMALL_ANGLE_LIMIT_DEG, STABILITY_CAUTIONS, type LedgerCondition } from "~/domain/stability";
import { formatLength, formatWeight, inchesToMm, mmToInches, type LengthUnit } from "~/domain/units";

function Row({ label, before, after, testId }: { label: ReactNode; before: ReactNode; after: ReactNode; testId?: string }) {
  return (
    <tr className="border-b border-cloth-200 align-top" data-row={testId}>
      <th scope="row" className="py-1.5 pr-3 text-left font-medium">{label}</th>
      <td className="py-1.5 pr-3 tabular-nums" data-when="before">{before}</td>
      <td className="py-1.5 tabular-nums" data-when="after">{after}</td>
    </tr>
  );
}

export function ConditionRows({ before, after, unit }: { before: LedgerCondition; after: LedgerCondition; unit: LengthUnit }) {
  return (
    <>
      <Row testId="heel" label="Heel" before={describeHeel(before.heelDeg)} after={<strong>{describeHeel(after.heelDeg)}</strong>} />
      <Row
        testId="transverse-moment"
        label="Moment across"
        before={`${formatMoment(before.transverseMomentFtLb, unit)}${before.transverseMomentFtLb ? ` to ${before.transverseMomentFtLb > 0 ? "starboard" : "port"}` : ""}`}
        after={`${formatMoment(after.transverseMomentFtLb, unit)}${after.transverseMomentFtLb ? ` to ${after.transverseMomentFtLb > 0 ? "starboard" : "port"}` : ""}`}
      />
      {before.trim && after.trim && (
        <>
          <Row testId="trim" label="Trim from these weights" before={describeTrim(before.trim.changeIn, unit)} after={<strong>{describeTrim(after.trim.changeIn, unit)}</strong>} />
          <Row testId="bow" label="At the bow" before={describeDraftChange(before.trim.bowChangeIn, unit)} after={describeDraftChange(after.trim.bowChangeIn, unit)} />
          <Row testId="stern" label="At the stern" before={describeDraftChange(before.trim.sternChangeIn, unit)} after={describeDraftChange(after.trim.sternChangeIn, unit)} />
        </>
      )}
      <Row testId="gm" label="GM used" before={formatGm(before.gmFt * 304.8, unit)} after={formatGm(after.gmFt * 304.8, unit)} />
    </>
  );
}

export function WeightMoveResult({ input, unit, title, headingLevel = 3 }: { input: WeightMoveInput; unit: LengthUnit; title?: string; headingLevel?: 2 | 3 }) {
  const r = computeWeightMove(input);
  const H = headingLevel === 2 ? "h2" : "h3";
  const c = input.particulars;
  const weightText = formatWeight(r.item.weightKg, weightUnitFor(unit));
  const foreAft =
    Math.abs(r.foreAftMm) >= 1 ? `, ${formatLength(Math.abs(r.foreAftMm), unit)} ${r.foreAftMm > 0 ? "aft" : "forward"}` : "";
  const drawn = input.items.map((i, n) => ({
    id: i.id,
    label: String(n + 1),
    offCentreIn: mmToInches(i.id === r.item.id ? r.to.offCentreMm : i.offCentreMm),
    aftOfBowIn: mmToInches(i.id === r.item.id ? r.to.aftOfBowMm : i.aftOfBowMm),
    heightIn: (i.id === r.item.id ? r.to.heightMm : i.heightMm) === null ? null : mmToInches((i.id === r.item.id ? r.to.heightMm : i.heightMm) as number),
    weightLb: r.items.find((x) => x.id === i.id)?.weightLb ?? 0,
    role: (i.id === r.item.id ? "after" : "item") as "after" | "item",
  }));
  const beforeMarker = {
    id: r.item.id,
    label: "",
    offCentreIn: mmToInches(r.from.offCentreMm),
    aftOfBowIn: mmToInches(r.from.aftOfBowMm),
    heightIn: r.from.heightMm === null ? null : mmToInches(r.from.heightMm),
    weightLb: drawn.find((d) => d.id === r.item.id)?.weightLb ?? 0,
    role: "before" as const,
  };
  const largeAngle = !r.before.withinSmallAngleRange || !r.after.withinSmallAngleRange;
  return (
    <section className="space-y-4 rounded-lg border border-cloth-200 bg-white/70 p-4 sm:p-5" data-calculation="weight-move">
      <div>
        <H className="text-step-1 font-semibold">{title || `Moving the ${r.item.name.toLowerCase()}`}</H>
        <p className="mt-1">
          {weightText} moved from {describePosition(r.from, unit)} to {describePosition(r.to, unit)}: {" "}
          <strong>{formatLength(Math.abs(r.acrossMm), unit)} {Math.abs(r.acrossMm) < 0.5 ? "across" : `to ${r.acrossMm > 0 ? "starboard" : "port"}`}</strong>
          {foreAft}.
        </p>
        {input.boat && (
          <p className="text-step--1 text-ink-soft">
            Worked out on hull {input.boat.hullNumber}{input.boat.name ? `, ${input.boat.name}` : ""}, with {input.items.length}{" "}
            {input.items.length === 1 ? "weight" : "weights"} in its ledger.
          </p>
        )}
      </div>
      <div className="overflow-x-auto">
        <table className="w-full border-collapse text-step--1">
          <thead>
            <tr className="border-b border-cloth-300 text-left">
              <th scope="col" className="py-1.5 pr-3 font-medium"><span className="sr-only">Figure</span></th>
              <th scope="col" className="py-1.5 pr-3 font-medium">Before</th>
              <th scope="col" className="py-1.5 font-medium">After the move</th>
            </tr>
          </thead>
          <tbody>
            <ConditionRows before={r.before} after={r.after} unit={unit} />
          </tbody>
        </table>
      </div>
      <p className="text-step--1 text-ink-soft">
        Displacement {formatPounds(r.after.displacementLb, unit)} ({formatWeight(c.lightDisplacementKg, weightUnitFor(unit))} light, plus the ledger);
        GM {formatGm(input.gmMm, unit)} {input.gmSource === "calibrated" ? "measured on this boat" : "of the class"}
        {r.after.trim ? `; MCT1 ${formatMct1(r.after.trim.mct1FtLbPerIn, unit)}` : ""}.
        {c.demo ? " The class figures are invented demo values." : ""}
      </p>
      {r.withinBeam === false && (
        <p role="alert" className="font-medium text-bootstripe-600">
          The new position is {describeOffset(r.to.offCentreMm, unit)}, more than half the beam: outside the hull.
        </p>
      )}
      {largeAngle && (
        <p role="alert" className="font-medium text-bootstripe-600">
          Past about {SMALL_ANGLE_LIMIT_DEG} degrees these relations stop being a fair estimate. Ask a naval architect.
        </p>
      )}
      <div className="grid gap-4 md:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
        <SectionDrawing beamIn={mmToInches(c.beamMm)} heelDeg={r.after.heelDeg} weights={[beforeMarker, ...drawn]} caption="After the move, looking forward (true angle)." widthPx={300} />
        <PlanDrawing
          loaIn={mmToInches(c.loaMm)}
          beamIn={mmToInches(c.beamMm)}
          waterlineForwardEndIn={mmToInches(c.waterlineForwardEndMm)}
          lwlIn={mmToInches(c.lwlMm)}
          lcfIn={mmToInches(c.lcfAftOfBowMm)}
          weights={[beforeMarker, ...drawn]}
          caption="From above, bow to the left: the move."
          widthPx={440}
        />
      </div>
      <WeightKey moved />
      <details className="text-step--1 text-ink-soft">
        <summary className="cursor-pointer font-medium text-deep-700">How this is worked out</summary>
        <p className="mt-2">
          Heel: tan θ = Σ w·y / (Δ·GM), the inclining relation (ASTM F1321), with w each weight, y its distance off the
          centreline and Δ the displacement. Trim: the moment about the centre of flotation divided by the moment to change
          trim one inch, MCT1 = Δ·GM_L / (12·L); the boat pivots about the centre of flotation.
          {r.after.gmFt !== r.before.gmFt
            ? ` Raising or lowering the weight moves the centre of gravity: GM changes by w·Δh/Δ (${formatLength(Math.abs(inchesToMm((r.before.gmFt - r.after.gmFt) * 12)), unit)}).`
            : ""}
        </p>
      </details>
      <aside className="rounded-md border-l-4 border-bootstripe-600 bg-bootstripe-50 p-3 text-step--1">
        <h4 className="font-sans font-semibold text-bootstripe-800">Weight and stability</h4>
        <ul className="mt-1 list-disc space-y-1 pl-5">
          {STABILITY_CAUTIONS.map((t) => <li key={t}>{t}</li>)}
        </ul>
      </aside>
    </section>
  );
}
