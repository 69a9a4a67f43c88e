// A DC cable run sized by voltage drop and by ampacity, with the overcurrent limit and the
// cautions. Used on /tools/cable and on a write-up that carries a cable-run calculation.
import { computeCableRun } from "~/domain/calculation-results";
import type { CableRunStored } from "~/domain/calculations";
import { DROP_CATEGORIES, NEC_CH9_TABLE8, type Awg, type InsulationRatingC } from "~/domain/conductors";
import { K_COPPER, tableAmpacity } from "~/domain/cable";
import { MM_PER_FOOT, type LengthUnit } from "~/domain/units";

const cm = (n: number) => Math.round(n).toLocaleString("en-US");

function feet(ft: number, unit: LengthUnit): string {
  return unit === "mm" ? `${((ft * MM_PER_FOOT) / 1000).toFixed(2)} m` : `${Number(ft.toFixed(2))} ft`;
}

export function CableRunResult({ input, unit, title, headingLevel = 3 }: { input: CableRunStored; unit: LengthUnit; title?: string; headingLevel?: 2 | 3 }) {
  const r = computeCableRun(input);
  const H = headingLevel === 2 ? "h2" : "h3";
  const oneWayFt = input.oneWayLengthMm / MM_PER_FOOT;
  const what = `${input.currentA} A over ${feet(oneWayFt, unit)} one way at ${input.systemVoltage} V, ${input.allowedDropPct} % drop allowed, ${input.insulationRatingC} °C insulation${input.inEngineSpace ? ", inside an engine space" : ""}`;
  return (
    <section className="space-y-4 rounded-lg border border-cloth-200 bg-white/70 p-4 sm:p-5" data-calculation="cable-run">
      <div>
        <H className="text-step-1 font-semibold">{title || input.label || "Cable for the run"}</H>
        <p className="mt-1 text-step--1 text-ink-soft">{what}. {DROP_CATEGORIES[input.allowedDropPct]} take {input.allowedDropPct} % (ABYC E-11).</p>
      </div>
      {!r.ok ? (
        <p role="alert" className="rounded-md border-l-4 border-bootstripe-600 bg-bootstripe-50 p-3 text-bootstripe-800" data-cable-failure={r.reason}>
          {r.message}
        </p>
      ) : (
        <>
          <p className="text-step-1" data-awg={r.chosen}>
            Use at least <strong className="font-semibold">{r.chosen} AWG</strong>
            <span className="text-step-0 text-ink-soft">
              {" "}({r.governedBy === "both" ? "voltage drop and ampacity agree" : `the ${r.governedBy} governs`})
            </span>
          </p>
          <div className="overflow-x-auto">
            <table className="w-full border-collapse text-step--1">
              <tbody>
                <tr className="border-b border-cloth-200 align-top" data-row="circular-mils">
                  <th scope="row" className="py-1.5 pr-3 text-left font-medium">Circular mils needed</th>
                  <td className="py-1.5 tabular-nums">
                    {cm(r.requiredCircularMils)} CM = {K_COPPER} × {input.currentA} A × {feet(r.roundTripFt, "in")} round trip / {r.allowedDropV.toFixed(2)} V
                  </td>
                </tr>
                <tr className="border-b border-cloth-200 align-top" data-row="by-area">
                  <th scope="row" className="py-1.5 pr-3 text-left font-medium">By area</th>
                  <td className="py-1.5 tabular-nums">{r.sizes.byArea} AWG ({cm(NEC_CH9_TABLE8[r.sizes.byArea as Awg].circularMils)} CM)</td>
                </tr>
                <tr className="border-b border-cloth-200 align-top" data-row="by-resistance">
                  <th scope="row" className="py-1.5 pr-3 text-left font-medium">By copper resistance</th>
                  <td className="py-1.5 tabular-nums">
                    {r.sizes.byResistance} AWG ({NEC_CH9_TABLE8[r.sizes.byResistance as Awg].ohmsPerKft} Ω per 1000 ft)
                  </td>
                </tr>
                <tr className="border-b border-cloth-200 align-top" data-row="drop-size">
                  <th scope="row" className="py-1.5 pr-3 text-left font-medium">For the voltage drop</th>
                  <td className="py-1.5">
                    <strong>{r.dropSize} AWG</strong>{" "}
                    {r.dropGovernedBy === "both" ? "(area and resistance agree)" : `(the ${r.dropGovernedBy === "area" ? "area" : "resistance"} calculation governs)`}
                  </td>
                </tr>
                <tr className="border-b border-cloth-200 align-top" data-row="ampacity">
                  <th scope="row" className="py-1.5 pr-3 text-left font-medium">For the current (ampacity)</th>
                  <td className="py-1.5">
                    <strong>{r.ampacitySize} AWG</strong> ({tableAmpacity(r.ampacitySize, input.insulationRatingC as InsulationRatingC, input.inEngineSpace)} A);{" "}
                    column: {r.ampacityColumn}
                  </td>
                </tr>
                <tr className="border-b border-cloth-200 align-top" data-row="drop">
                  <th scope="row" className="py-1.5 pr-3 text-left font-medium">Drop with {r.chosen} AWG</th>
                  <td className="py-1.5 tabular-nums">
                    {r.actualDropV.toFixed(3)} V, <strong data-drop-percent={r.actualDropPct.toFixed(2)}>{r.actualDropPct.toFixed(2)} %</strong> (allowed {input.allowedDropPct} %)
                  </td>
                </tr>
                <tr className="border-b border-cloth-200 align-top" data-row="overcurrent">
                  <th scope="row" className="py-1.5 pr-3 text-left font-medium">Fuse or breaker</th>
                  <td className="py-1.5">
                    A standard rating at or just above what the load draws ({input.currentA} A), or the one its maker calls for
                    (common practice), and <strong>never above <span className="tabular-nums" data-max-overcurrent={r.maxOvercurrentA}>{r.maxOvercurrentA} A</span></strong>:
                    the most this conductor may have, 150 % of its {r.chosenAmpacityA} A (33 CFR 183.455(c)). That ceiling protects the
                    cable; it is not the fuse to buy.
                  </td>
                </tr>
              </tbody>
            </table>
          </div>
          <p className="text-step--1 text-ink-soft" data-sized-against>Sized against: {r.sizedAgainst}</p>
          <p className="text-step--1 text-ink-soft">The drop is worked on the round trip, out on the positive and back on the negative: {feet(r.roundTripFt, unit)}.</p>
        </>
      )}
      <aside className="rounded-md border-l-4 border-bootstripe-600 bg-bootstripe-50 p-3 text-step--1">
        <h4 className="font-sans font-semibold text-bootstripe-800">Overcurrent protection and batteries</h4>
        <ul className="mt-1 list-disc space-y-1 pl-5">
          {r.cautions.map((t) => <li key={t}>{t}</li>)}
        </ul>
      </aside>
    </section>
  );
}
