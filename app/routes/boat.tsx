import { getFormProps, getInputProps, getSelectProps, useForm, type FieldMetadata } from "@conform-to/react";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { useEffect, useState } from "react";
import { data, Form, Link, useLocation } from "react-router";
import type { Route } from "./+types/boat";
import { PlanDrawing, SectionDrawing, WeightKey } from "~/components/boat-drawings";
import { CautionList } from "~/components/cautions";
import { buttonClass, FieldError, FormMessage, inputClass, Notice, quietButtonClass, TextField } from "~/components/ui/field";
import { UnitToggle } from "~/components/unit-toggle";
import { WeightMoveResult } from "~/components/weight-move-result";
import { db } from "~/db/index.server";
import {
  addWeightSchema,
  boatLimits,
  calibrationSchema,
  fieldsOf,
  firstErrors,
  ledgerItemSchema,
  queryObject,
  unitsFor,
  whatIfSchema,
  type BoatLimits,
} from "~/domain/boat-forms";
import type { WeightMoveInput } from "~/domain/calculations";
import { CAUTIONS } from "~/domain/cautions";
import { CLASS_NAME, variantOf } from "~/domain/hulls";
import {
  boatCondition,
  describeDraftChange,
  describeHeel,
  describeOffset,
  describeShift,
  describeTrim,
  formatGm,
  formatMct1,
  formatMoment,
  formatPounds,
  levelPlans,
  sideOf,
  weightToLevelAt,
  weightUnitFor,
  type ClassFigures,
  type LedgerEntry,
} from "~/domain/ledger";
import { formatLength, formatWeight, kgToPounds, mmToInches, type LengthUnit } from "~/domain/units";
import {
  addCalibration,
  addLedgerItem,
  clearCalibrations,
  getBoatByHull,
  isOwner,
  listBoatWriteups,
  listStandardItems,
  loadBoatStability,
  removeLedgerItem,
  spacePositions,
  updateLedgerItem,
} from "~/models/boats.server";
import { listSpaces } from "~/models/spaces.server";
import { readNotice, redirectWithNotice, requireUser } from "~/services/session.server";
import { readerUnit } from "./reader-unit.server";
import { readForm } from "~/services/form-body.server";

/** Before the class particulars are set, positions are checked against these (10 m, 2 m). */
const FALLBACK_LIMITS: BoatLimits = { maxAftMm: 10_000, halfBeamMm: 2_000 };

function hullParam(value: string | undefined): number {
  const n = Number(value);
  if (!/^\d{1,4}$/.test(value ?? "") || !Number.isInteger(n)) throw data("No such hull number", { status: 404 });
  return n;
}

function unitOf(value: FormDataEntryValue | null): LengthUnit {
  return value === "mm" ? "mm" : "in";
}

/** A length as typed into a form (without the unit when it is the reader's). */
function typed(mm: number, unit: LengthUnit): string {
  return formatLength(mm, unit);
}

function typedWeight(kg: number, unit: LengthUnit): string {
  return formatWeight(kg, weightUnitFor(unit));
}

export function meta({ loaderData }: Route.MetaArgs) {
  if (!loaderData) return [{ title: "Boat not found · Sistership" }];
  const b = loaderData.boat;
  return [{ title: `Hull ${b.hullNumber}${b.name ? `, ${b.name}` : ""} · ${CLASS_NAME} · Sistership` }];
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const hull = hullParam(params.hull);
  const boat = await getBoatByHull(db, hull);
  if (!boat) throw data(`Hull ${hull} is not registered in Sistership.`, { status: 404 });
  const unit = await readerUnit(request, user);
  const units = unitsFor(unit);
  const [stability, writeups, standardItems, spaces, { notice, headers }] = await Promise.all([
    loadBoatStability(db, boat.id),
    listBoatWriteups(db, boat.id),
    listStandardItems(db),
    listSpaces(db, { hull }),
    readNotice(request),
  ]);
  const { particulars, ledger } = stability;
  const limits = particulars ? boatLimits(particulars) : FALLBACK_LIMITS;
  const q = new URL(request.url).searchParams;
  const entries: LedgerEntry[] = ledger.map(({ id, name, weightKg, aftOfBowMm, offCentreMm, heightMm }) => ({ id, name, weightKg, aftOfBowMm, offCentreMm, heightMm }));

  // What if: move one item (GET, so the page can be shared and nothing is changed).
  const whatIfValues = queryObject(q, ["move", "toSpace", "toAftOfBow", "toSide", "toOffCentre", "toHeight"]);
  let whatIfErrors: Record<string, string> = {};
  let whatIf: WeightMoveInput | null = null;
  if (whatIfValues.move && particulars && stability.gmMm !== null) {
    const r = whatIfSchema(units, limits).safeParse(whatIfValues);
    if (!r.success) whatIfErrors = firstErrors(r.error);
    else {
      const v = r.data;
      const item = entries.find((e) => e.id === String(v.itemId));
      const space = v.spaceId ? spaces.find((sp) => sp.id === v.spaceId) : undefined;
      if (!item) whatIfErrors = { move: "Choose an item of the ledger." };
      else if (v.spaceId && !space) whatIfErrors = { toSpace: "Choose a space of this hull." };
      else if (!space && v.aftOfBowMm === null && v.offCentreMm === null && v.heightMm === null) {
        whatIfErrors = { toAftOfBow: "Say where it goes: pick a space, or type a new place (any field left empty keeps its present figure)." };
      } else {
        whatIf = {
          boat: { hullNumber: boat.hullNumber, name: boat.name },
          particulars: { ...particulars },
          gmMm: stability.gmMm,
          gmSource: stability.gmSource,
          items: entries,
          moved: item.id,
          to: {
            aftOfBowMm: v.aftOfBowMm ?? space?.position.aftOfBowMm ?? item.aftOfBowMm,
            offCentreMm: v.offCentreMm ?? space?.position.offCentreMm ?? item.offCentreMm,
            heightMm: v.heightMm ?? space?.position.heightMm ?? item.heightMm,
          },
          note: "",
        };
      }
    }
  }

  // The inverse, by adding: what weight at a given place brings her upright.
  const addValues = queryObject(q, ["addSide", "addOffCentre"]);
  let addErrors: Record<string, string> = {};
  let addResult: { offCentreMm: number; weightKg: number | null } | null = null;
  if (addValues.addOffCentre !== undefined || addValues.addSide !== undefined) {
    const r = addWeightSchema(units, limits).safeParse(addValues);
    if (!r.success) addErrors = firstErrors(r.error);
    else addResult = { offCentreMm: r.data.offCentreMm, weightKg: weightToLevelAt(entries, r.data.offCentreMm) };
  }

  const editId = Number(q.get("edit"));
  const editing = ledger.find((i) => i.itemId === editId) ?? null;

  return data(
    {
      unit,
      owner: isOwner(boat, user.id),
      isAdmin: user.roles.includes("admin"),
      boat: { ...boat, variant: variantOf(boat.hullNumber)?.label ?? "" },
      particulars,
      limits,
      gm: { mm: stability.gmMm, source: stability.gmSource },
      calibrations: stability.calibrations.map((c) => ({ ...c, createdAt: c.createdAt.toISOString() })),
      ledger,
      entries,
      writeups: writeups.map((w) => ({ ...w, publishedAt: w.publishedAt?.toISOString() ?? null })),
      standardItems,
      spaces: spaces.map((sp) => ({ id: sp.id, name: sp.name, ...sp.position })),
      editing,
      whatIf: { values: whatIfValues, errors: whatIfErrors, input: whatIf },
      add: { values: addValues, errors: addErrors, result: addResult },
      notice,
    },
    { headers },
  );
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requireUser(request);
  const hull = hullParam(params.hull);
  const boat = await getBoatByHull(db, hull);
  if (!boat) throw data(`Hull ${hull} is not registered in Sistership.`, { status: 404 });
  if (!isOwner(boat, user.id)) throw data("Only the boat's owners can change its ledger.", { status: 403 });
  const formData = await readForm(request);
  const unit = unitOf(formData.get("unit"));
  const units = unitsFor(unit);
  const intent = String(formData.get("intent") ?? "");
  const back = `/boats/${hull}${unit !== (user.units ?? "in") ? `?unit=${unit}` : ""}`;
  const stability = await loadBoatStability(db, boat.id);
  const limits = stability.particulars ? boatLimits(stability.particulars) : FALLBACK_LIMITS;

  switch (intent) {
    case "add-item":
    case "edit-item": {
      const submission = parseWithZod(formData, { schema: ledgerItemSchema(units, limits) });
      if (submission.status !== "success") return data({ intent, result: submission.reply() }, { status: 400 });
      const v = submission.value;
      let { aftOfBowMm, offCentreMm, heightMm } = v;
      if (v.spaceId !== null) {
        const [space] = await spacePositions(db, [v.spaceId]);
        if (!space) {
          return data({ intent, result: submission.reply({ fieldErrors: { spaceId: ["Choose a space from the list."] } }) }, { status: 400 });
        }
        aftOfBowMm ??= space.aftOfBowMm;
        offCentreMm ??= space.offCentreMm;
        if (heightMm === null && !String(formData.get("aftOfBow") ?? "").trim()) heightMm = space.heightMm;
      }
      const item = { name: v.name, weightKg: v.weightKg, aftOfBowMm: aftOfBowMm as number, offCentreMm: offCentreMm as number, heightMm, spaceId: v.spaceId };
      if (intent === "edit-item") {
        const ok = await updateLedgerItem(db, boat.id, v.itemId as number, item);
        if (!ok) return data({ intent, result: submission.reply({ formErrors: ["That item is no longer in the ledger."] }) }, { status: 400 });
        return redirectWithNotice(request, `${back}#ledger`, `${v.name} is updated.`);
      }
      await addLedgerItem(db, boat.id, item);
      return redirectWithNotice(request, `${back}#ledger`, `${v.name} is in the ledger.`);
    }
    case "add-standard": {
      const slug = String(formData.get("slug") ?? "");
      const std = (await listStandardItems(db)).find((i) => i.slug === slug);
      if (!std) return data({ intent, error: "Choose one of the class's items." }, { status: 400 });
      await addLedgerItem(db, boat.id, {
        name: std.name,
        weightKg: std.weightKg,
        aftOfBowMm: std.aftOfBowMm,
        offCentreMm: std.offCentreMm,
        heightMm: std.heightMm,
        spaceId: null,
        standardItemSlug: std.slug,
      });
      return redirectWithNotice(request, `${back}#ledger`, `${std.name} is in the ledger with the class's demo figures: edit them to match your boat.`);
    }
    case "remove-item": {
      const itemId = Number(formData.get("itemId"));
      const ok = Number.isInteger(itemId) && (await removeLedgerItem(db, boat.id, itemId));
      if (!ok) return data({ intent, error: "That item is no longer in the ledger." }, { status: 400 });
      return redirectWithNotice(request, `${back}#ledger`, "The item is out of the ledger.");
    }
    case "calibrate": {
      const submission = parseWithZod(formData, { schema: calibrationSchema(units) });
      if (submission.status !== "success") return data({ intent, result: submission.reply() }, { status: 400 });
      const gmMm = await addCalibration(db, boat.id, user.id, submission.value);
      return redirectWithNotice(request, `${back}#gm`, `GM ${formatGm(gmMm, unit)} from your measurement is now used for hull ${hull}.`);
    }
    case "clear-calibration": {
      await clearCalibrations(db, boat.id);
      return redirectWithNotice(request, `${back}#gm`, `Hull ${hull} uses the class GM again.`);
    }
    default:
      return data({ intent: null, error: "Unknown action." }, { status: 400 });
  }
}

function Section({ id, title, children, lead }: { id: string; title: string; lead?: React.ReactNode; children: React.ReactNode }) {
  return (
    <section id={id} aria-labelledby={`${id}-heading`} className="scroll-mt-4 space-y-4">
      <div>
        <h2 id={`${id}-heading`} className="text-step-2 font-semibold">{title}</h2>
        {lead && <p className="mt-1 max-w-3xl text-ink-soft">{lead}</p>}
      </div>
      {children}
    </section>
  );
}

type Loader = Route.ComponentProps["loaderData"];
type ActionResult = Route.ComponentProps["actionData"];

export default function BoatPage({ loaderData, actionData }: Route.ComponentProps) {
  const { unit, owner, boat, particulars, gm, ledger, entries, writeups, notice } = loaderData;
  const condition = particulars && gm.mm !== null ? boatCondition(particulars, entries, gm.mm) : null;
  const weightUnit = weightUnitFor(unit);
  const totalKg = entries.reduce((s, e) => s + e.weightKg, 0);
  const drawnWeights = entries.map((e, n) => ({
    id: e.id,
    label: String(n + 1),
    offCentreIn: mmToInches(e.offCentreMm),
    aftOfBowIn: mmToInches(e.aftOfBowMm),
    heightIn: e.heightMm === null ? null : mmToInches(e.heightMm),
    weightLb: kgToPounds(e.weightKg),
  }));
  const actionError = actionData && "error" in actionData ? actionData.error : null;

  return (
    <div className="space-y-12">
      <header className="space-y-3">
        <p className="text-step--1 text-ink-soft"><Link to="/account">Your account</Link> · {CLASS_NAME}</p>
        <h1 className="text-step-4 font-semibold leading-tight">
          Hull {boat.hullNumber}{boat.name ? <>, <em className="font-serif">{boat.name}</em></> : null}
        </h1>
        <dl className="flex flex-wrap gap-x-8 gap-y-1">
          <div className="flex gap-2"><dt className="text-ink-soft">Variant</dt><dd>{boat.variant}</dd></div>
          <div className="flex gap-2"><dt className="text-ink-soft">{boat.owners.length === 1 ? "Owner" : "Owners"}</dt><dd>{boat.owners.map((o) => o.displayName).join(", ")}</dd></div>
        </dl>
        <div className="flex flex-wrap items-center justify-between gap-3">
          {notice ? <Notice>{notice}</Notice> : <span />}
          <UnitToggle unit={unit} />
        </div>
        {actionError && <p role="alert" className="font-medium text-bootstripe-600">{actionError}</p>}
      </header>

      <Section id="afloat" title="How she floats with this ledger">
        {!particulars || !condition ? (
          <p className="text-ink-soft">
            The class particulars are not set yet: an administrator enters them on the <Link to="/admin/class">class page</Link>, then heel and trim appear here.
          </p>
        ) : (
          <>
            <div className="grid gap-4 sm:grid-cols-3" data-testid="condition">
              <div className="rounded-lg bg-cloth-100 p-4">
                <p className="text-step--1 text-ink-soft">Predicted list</p>
                <p className="text-step-2 font-semibold" data-heel={condition.heelDeg.toFixed(4)}>{describeHeel(condition.heelDeg)}</p>
                <p className="text-step--1 text-ink-soft">
                  Moment {formatMoment(condition.transverseMomentFtLb, unit)}
                  {Math.abs(condition.transverseMomentFtLb) > 1e-9 ? ` to ${condition.transverseMomentFtLb > 0 ? "starboard" : "port"}` : ""}
                </p>
              </div>
              <div className="rounded-lg bg-cloth-100 p-4">
                <p className="text-step--1 text-ink-soft">Trim from the ledger</p>
                {condition.trim ? (
                  <>
                    <p className="text-step-2 font-semibold" data-trim={condition.trim.changeIn.toFixed(4)}>{describeTrim(condition.trim.changeIn, unit)}</p>
                    <p className="text-step--1 text-ink-soft">
                      Bow {describeDraftChange(condition.trim.bowChangeIn, unit)}, stern {describeDraftChange(condition.trim.sternChangeIn, unit)}
                    </p>
                  </>
                ) : (
                  <p className="text-ink-soft">Needs GM_L or MCT1 in the class particulars.</p>
                )}
              </div>
              <div className="rounded-lg bg-cloth-100 p-4">
                <p className="text-step--1 text-ink-soft">Displacement and GM</p>
                <p className="font-semibold">{formatPounds(condition.displacementLb, unit)}</p>
                <p className="text-step--1 text-ink-soft">
                  GM {formatGm(condition.gmFt * 304.8, unit)} ({gm.source === "calibrated" ? "measured on this boat" : "class figure"})
                  {condition.trim ? `; MCT1 ${formatMct1(condition.trim.mct1FtLbPerIn, unit)}` : ""}
                </p>
              </div>
            </div>
            {particulars.demo && (
              <p className="text-step--1 text-ink-soft" data-demo-values>
                The class figures (light displacement {formatWeight(particulars.lightDisplacementKg, weightUnit)}, GM {formatGm(particulars.gmMm, unit)},
                waterline {formatLength(particulars.lwlMm, unit)}, and the trim figures) are invented demo values.
                {loaderData.isAdmin && <> <Link to="/admin/class">Set the class figures</Link>.</>}
              </p>
            )}
            {!condition.withinSmallAngleRange && (
              <p role="alert" className="font-medium text-bootstripe-600">This heel is past the small angles these estimates hold for. Ask a naval architect.</p>
            )}
            <div className="grid gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
              <SectionDrawing beamIn={mmToInches(particulars.beamMm)} heelDeg={condition.heelDeg} weights={drawnWeights} />
              <PlanDrawing
                loaIn={mmToInches(particulars.loaMm)}
                beamIn={mmToInches(particulars.beamMm)}
                waterlineForwardEndIn={mmToInches(particulars.waterlineForwardEndMm)}
                lwlIn={mmToInches(particulars.lwlMm)}
                lcfIn={mmToInches(particulars.lcfAftOfBowMm)}
                weights={drawnWeights}
              />
            </div>
            <WeightKey />
          </>
        )}
      </Section>

      <Section
        id="ledger"
        title="Weights aboard"
        lead="What has been added to the boat since she was built light: each weight and where it sits. Port and starboard as you face forward."
      >
        {ledger.length === 0 ? (
          <p className="text-ink-soft" data-testid="ledger-empty">Nothing in the ledger yet.{owner ? " Start from the class's items below, or add your own." : ""}</p>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full border-collapse text-step--1" data-testid="ledger">
              <thead>
                <tr className="border-b border-cloth-300 text-left">
                  <th scope="col" className="py-2 pr-2">#</th>
                  <th scope="col" className="py-2 pr-3">Item</th>
                  <th scope="col" className="py-2 pr-3 text-right">Weight</th>
                  <th scope="col" className="py-2 pr-3">Aft of the bow</th>
                  <th scope="col" className="py-2 pr-3">Off the centreline</th>
                  <th scope="col" className="py-2 pr-3">Height</th>
                  <th scope="col" className="py-2 pr-3 text-right">Moment across</th>
                  {owner && <th scope="col" className="py-2"><span className="sr-only">Change</span></th>}
                </tr>
              </thead>
              <tbody>
                {ledger.map((i, n) => {
                  const moment = (kgToPounds(i.weightKg) * mmToInches(i.offCentreMm)) / 12;
                  return (
                    <tr key={i.id} className="border-b border-cloth-200 align-top" data-item={i.name}>
                      <td className="py-2 pr-2 tabular-nums text-ink-soft">{n + 1}</td>
                      <td className="py-2 pr-3">
                        <span className="font-medium">{i.name}</span>
                        {i.spaceName && <span className="block text-ink-soft">in: {i.spaceName}</span>}
                      </td>
                      <td className="py-2 pr-3 text-right tabular-nums">{formatWeight(i.weightKg, weightUnit)}</td>
                      <td className="py-2 pr-3 tabular-nums">{formatLength(i.aftOfBowMm, unit)}</td>
                      <td className="py-2 pr-3">{describeOffset(i.offCentreMm, unit)}</td>
                      <td className="py-2 pr-3 tabular-nums">{i.heightMm === null ? <span className="text-ink-soft">not given</span> : formatLength(i.heightMm, unit)}</td>
                      <td className="py-2 pr-3 text-right tabular-nums">
                        {Math.abs(moment) < 1e-9 ? "none" : `${formatMoment(moment, unit)} to ${moment > 0 ? "starboard" : "port"}`}
                      </td>
                      {owner && (
                        <td className="py-2">
                          <div className="flex flex-nowrap justify-end gap-2">
                            <Link to={`?${new URLSearchParams({ unit, edit: String(i.itemId) })}#item-form`} className={`${quietButtonClass} px-2 py-1`} aria-label={`Edit ${i.name}`} preventScrollReset>
                              Edit
                            </Link>
                            <Form method="post" preventScrollReset>
                              <input type="hidden" name="unit" value={unit} />
                              <input type="hidden" name="itemId" value={i.itemId} />
                              <button type="submit" name="intent" value="remove-item" className={`${quietButtonClass} px-2 py-1`} aria-label={`Remove ${i.name}`}>
                                Remove
                              </button>
                            </Form>
                          </div>
                        </td>
                      )}
                    </tr>
                  );
                })}
              </tbody>
              <tfoot>
                <tr className="font-medium">
                  <td />
                  <td className="py-2 pr-3">Added to the light boat</td>
                  <td className="py-2 pr-3 text-right tabular-nums">{formatWeight(totalKg, weightUnit)}</td>
                  <td colSpan={3} />
                  <td className="py-2 pr-3 text-right tabular-nums">
                    {condition ? (Math.abs(condition.transverseMomentFtLb) < 1e-9 ? "none" : `${formatMoment(condition.transverseMomentFtLb, unit)} to ${condition.transverseMomentFtLb > 0 ? "starboard" : "port"}`) : ""}
                  </td>
                  {owner && <td />}
                </tr>
              </tfoot>
            </table>
          </div>
        )}
        {owner && <LedgerEditing loaderData={loaderData} actionData={actionData} />}
      </Section>

      {particulars && condition && entries.length > 0 && (
        <>
          <WhatIfSection loaderData={loaderData} />
          <LevelSection loaderData={loaderData} heelDeg={condition.heelDeg} />
        </>
      )}

      {particulars && <CalibrationSection loaderData={loaderData} actionData={actionData} displacementLb={condition?.displacementLb ?? null} />}

      <Section id="writeups" title="Work done on her">
        {writeups.length === 0 ? (
          <p className="text-ink-soft">No published write-up of work on this boat yet.</p>
        ) : (
          <ul className="space-y-3">
            {writeups.map((w) => (
              <li key={w.slug}>
                <Link to={`/writeups/${w.slug}`} className="font-medium">{w.title}</Link>
                {w.summary && <p className="text-step--1 text-ink-soft">{w.summary}</p>}
              </li>
            ))}
          </ul>
        )}
      </Section>

      <div className="space-y-3">
        <CautionList cautions={[CAUTIONS.stability, CAUTIONS.battery, CAUTIONS.wiring]} about="figures" />
        <p className="text-step--1 text-ink-soft">
          Moving a battery? <Link to={`/tools/cable?unit=${unit}`}>Size the cable for its new run</Link>, or try the{" "}
          <Link to={`/tools/heel?unit=${unit}`}>heel calculator</Link> on its own.
        </p>
      </div>
    </div>
  );
}

// ---------------------------------------------------------------------------------------------
// Adding and editing ledger items (owners).

function SideSelect({ field, label, allowKeep }: { field: FieldMetadata<any>; label: string; allowKeep?: boolean }) {
  return (
    <div>
      <label htmlFor={field.id} className="block font-medium">{label}</label>
      <select {...getSelectProps(field)} key={field.key} className={`mt-1 ${inputClass}`}>
        {allowKeep && <option value="">(as it is)</option>}
        <option value="port">to port</option>
        <option value="centre">on the centreline</option>
        <option value="starboard">to starboard</option>
      </select>
      <FieldError id={field.errorId} errors={field.errors} />
    </div>
  );
}

function LedgerEditing({ loaderData, actionData }: { loaderData: Loader; actionData: ActionResult }) {
  const { unit, editing, spaces, standardItems, limits } = loaderData;
  const weightUnit = weightUnitFor(unit);
  const intent = editing ? "edit-item" : "add-item";
  const schema = ledgerItemSchema(unitsFor(unit), limits);
  const lastResult = actionData && "result" in actionData && (actionData.intent === "add-item" || actionData.intent === "edit-item") ? actionData.result : undefined;
  const [form, f] = useForm({
    id: editing ? `edit-item-${editing.itemId}` : "add-item",
    lastResult,
    constraint: getZodConstraint(fieldsOf(schema)),
    defaultValue: editing
      ? {
          name: editing.name,
          weight: typedWeight(editing.weightKg, unit),
          spaceId: editing.spaceId === null ? "" : String(editing.spaceId),
          aftOfBow: typed(editing.aftOfBowMm, unit),
          side: sideOf(editing.offCentreMm),
          offCentre: sideOf(editing.offCentreMm) === "centre" ? "" : typed(Math.abs(editing.offCentreMm), unit),
          height: editing.heightMm === null ? "" : typed(editing.heightMm, unit),
        }
      : { side: "centre" },
    onValidate: ({ formData }) => parseWithZod(formData, { schema }),
    shouldValidate: "onBlur",
    shouldRevalidate: "onInput",
  });

  function placeInSpace(id: string) {
    const sp = spaces.find((s) => String(s.id) === id);
    if (!sp) return;
    const side = sideOf(sp.offCentreMm);
    form.update({ name: f.aftOfBow.name, value: typed(sp.aftOfBowMm, unit) });
    form.update({ name: f.side.name, value: side });
    form.update({ name: f.offCentre.name, value: side === "centre" ? "" : typed(Math.abs(sp.offCentreMm), unit) });
    form.update({ name: f.height.name, value: sp.heightMm === null ? "" : typed(sp.heightMm, unit) });
  }

  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
      <div id="item-form" className="scroll-mt-4">
      <Form method="post" {...getFormProps(form)} className="space-y-4 rounded-lg border border-cloth-200 bg-white/70 p-4" aria-label={editing ? `Edit ${editing.name}` : "Add a weight"} preventScrollReset>
        <h3 className="text-step-1 font-semibold">{editing ? `Edit: ${editing.name}` : "Add a weight"}</h3>
        <input type="hidden" name="intent" value={intent} />
        <input type="hidden" name="unit" value={unit} />
        {editing && <input type="hidden" name="itemId" value={editing.itemId} />}
        <FormMessage errors={form.errors} id={form.errorId} />
        <div className="grid gap-4 sm:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
          <TextField field={f.name} label="Item" hint="e.g. House battery, group 27" />
          <TextField field={f.weight} label="Weight" hint={`In ${weightUnit === "kg" ? "kilograms" : "pounds"} unless you type a unit`} />
        </div>
        <div>
          <label htmlFor={f.spaceId.id} className="block font-medium">In a space of the register (optional)</label>
          <p id={`${f.spaceId.id}-hint`} className="text-step--1 text-ink-soft">Picking one fills in its place; adjust the figures if yours sits elsewhere.</p>
          <select
            {...getSelectProps(f.spaceId)}
            key={f.spaceId.key}
            onChange={(e) => placeInSpace(e.target.value)}
            className={`mt-1 ${inputClass}`}
          >
            <option value="">(no space: type the place)</option>
            {spaces.map((sp) => <option key={sp.id} value={sp.id}>{sp.name}</option>)}
          </select>
          <FieldError id={f.spaceId.errorId} errors={f.spaceId.errors} />
        </div>
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField field={f.aftOfBow} label="Aft of the bow" hint={`To the middle of the item; e.g. ${unit === "mm" ? "3430 mm" : "11 ft 3 in"}`} />
          <TextField field={f.height} label="Height (optional)" hint="Above the inside of the hull bottom at the keel" />
          <SideSelect field={f.side} label="Side" />
          <TextField field={f.offCentre} label="Off the centreline" hint="How far to that side, to the middle of the item" />
        </div>
        <div className="flex flex-wrap gap-3">
          <button type="submit" className={buttonClass}>{editing ? "Save the item" : "Add to the ledger"}</button>
          {editing && <Link to={`?unit=${unit}`} className={quietButtonClass} preventScrollReset>Cancel</Link>}
        </div>
      </Form>
      </div>
      <div className="space-y-3">
        <h3 className="text-step-1 font-semibold">The class's usual items</h3>
        <p className="text-step--1 text-ink-soft">Added with invented demo weights and places: edit them to your boat afterwards.</p>
        <ul className="divide-y divide-cloth-200 rounded-lg border border-cloth-200 bg-white/70">
          {standardItems.map((i) => (
            <li key={i.slug} className="flex items-start justify-between gap-3 p-3">
              <div className="min-w-0">
                <p className="font-medium">{i.name}</p>
                <p className="text-step--1 text-ink-soft">
                  {formatWeight(i.weightKg, weightUnit)}, {formatLength(i.aftOfBowMm, unit)} aft of the bow, {describeOffset(i.offCentreMm, unit)}
                </p>
              </div>
              <Form method="post" preventScrollReset>
                <input type="hidden" name="unit" value={unit} />
                <input type="hidden" name="slug" value={i.slug} />
                <button type="submit" name="intent" value="add-standard" className={`${quietButtonClass} px-2 py-1`} aria-label={`Add ${i.name}`}>Add</button>
              </Form>
            </li>
          ))}
        </ul>
      </div>
    </div>
  );
}

// ---------------------------------------------------------------------------------------------
// What if, and the inverse.

function QueryField({ name, label, hint, value, onChange, error }: { name: string; label: string; hint?: string; value: string; onChange: (v: string) => void; error?: string }) {
  return (
    <div>
      <label htmlFor={`q-${name}`} className="block font-medium">{label}</label>
      <input
        id={`q-${name}`}
        name={name}
        value={value}
        onChange={(e) => onChange(e.target.value)}
        autoComplete="off"
        aria-invalid={error ? true : undefined}
        aria-describedby={[hint ? `q-${name}-hint` : "", error ? `q-${name}-error` : ""].filter(Boolean).join(" ") || undefined}
        className={`mt-1 ${inputClass}`}
      />
      {hint && <p id={`q-${name}-hint`} className="mt-0.5 text-step--1 text-ink-soft">{hint}</p>}
      <FieldError id={`q-${name}-error`} errors={error ? [error] : undefined} />
    </div>
  );
}

function WhatIfSection({ loaderData }: { loaderData: Loader }) {
  const { unit, ledger, spaces, whatIf } = loaderData;
  const location = useLocation();
  const [v, setV] = useState<Record<string, string>>(whatIf.values);
  useEffect(() => setV(whatIf.values), [location.search]); // eslint-disable-line react-hooks/exhaustive-deps
  const set = (k: string) => (value: string) => setV((old) => ({ ...old, [k]: value }));
  const errors = whatIf.errors;

  function pickSpace(id: string) {
    const sp = spaces.find((s) => String(s.id) === id);
    if (!sp) return setV((old) => ({ ...old, toSpace: "" }));
    const side = sideOf(sp.offCentreMm);
    setV((old) => ({
      ...old,
      toSpace: id,
      toAftOfBow: typed(sp.aftOfBowMm, unit),
      toSide: side,
      toOffCentre: side === "centre" ? "" : typed(Math.abs(sp.offCentreMm), unit),
      toHeight: sp.heightMm === null ? "" : typed(sp.heightMm, unit),
    }));
  }

  return (
    <Section id="what-if" title="What if you move something?" lead="Pick an item and where it would go: see the heel and trim before and after. Nothing is saved.">
      <Form method="get" className="space-y-4 rounded-lg bg-cloth-100 p-4" aria-label="Try a move" preventScrollReset>
        <input type="hidden" name="unit" value={unit} />
        <div className="grid gap-4 sm:grid-cols-2">
          <div>
            <label htmlFor="q-move" className="block font-medium">Item to move</label>
            <select id="q-move" name="move" value={v.move ?? ""} onChange={(e) => set("move")(e.target.value)} aria-invalid={errors.move ? true : undefined} className={`mt-1 ${inputClass}`}>
              <option value="">Choose…</option>
              {ledger.map((i) => <option key={i.itemId} value={i.itemId}>{i.name} ({describeOffset(i.offCentreMm, unit)})</option>)}
            </select>
            <FieldError id="q-move-error" errors={errors.move ? [errors.move] : undefined} />
          </div>
          <div>
            <label htmlFor="q-toSpace" className="block font-medium">To a space (optional)</label>
            <select id="q-toSpace" name="toSpace" value={v.toSpace ?? ""} onChange={(e) => pickSpace(e.target.value)} className={`mt-1 ${inputClass}`}>
              <option value="">(type the new place)</option>
              {spaces.map((sp) => <option key={sp.id} value={sp.id}>{sp.name}</option>)}
            </select>
            <FieldError id="q-toSpace-error" errors={errors.toSpace ? [errors.toSpace] : undefined} />
          </div>
        </div>
        <div className="grid gap-4 sm:grid-cols-4">
          <QueryField name="toAftOfBow" label="New place, aft of the bow" value={v.toAftOfBow ?? ""} onChange={set("toAftOfBow")} error={errors.toAftOfBow} hint="Empty: as it is" />
          <div>
            <label htmlFor="q-toSide" className="block font-medium">Side</label>
            <select id="q-toSide" name="toSide" value={v.toSide ?? ""} onChange={(e) => set("toSide")(e.target.value)} className={`mt-1 ${inputClass}`}>
              <option value="">(as it is)</option>
              <option value="port">to port</option>
              <option value="centre">on the centreline</option>
              <option value="starboard">to starboard</option>
            </select>
            <FieldError id="q-toSide-error" errors={errors.toSide ? [errors.toSide] : undefined} />
          </div>
          <QueryField name="toOffCentre" label="Off the centreline" value={v.toOffCentre ?? ""} onChange={set("toOffCentre")} error={errors.toOffCentre} />
          <QueryField name="toHeight" label="Height" value={v.toHeight ?? ""} onChange={set("toHeight")} error={errors.toHeight} hint="Empty: as it is" />
        </div>
        <button type="submit" className={buttonClass}>Show before and after</button>
      </Form>
      {whatIf.input && <WeightMoveResult input={whatIf.input} unit={unit} headingLevel={3} />}
    </Section>
  );
}

function LevelSection({ loaderData, heelDeg }: { loaderData: Loader; heelDeg: number }) {
  const { unit, particulars, entries, add, limits } = loaderData;
  const location = useLocation();
  const [addSide, setAddSide] = useState(add.values.addSide ?? (heelDeg > 0 ? "port" : "starboard"));
  const [addOff, setAddOff] = useState(add.values.addOffCentre ?? "");
  useEffect(() => {
    setAddSide(add.values.addSide ?? (heelDeg > 0 ? "port" : "starboard"));
    setAddOff(add.values.addOffCentre ?? "");
  }, [location.search]); // eslint-disable-line react-hooks/exhaustive-deps
  const upright = describeHeel(heelDeg) === "upright";
  const plans = levelPlans(particulars as ClassFigures, entries);
  const weightUnit = weightUnitFor(unit);
  const tryLink = (entryId: string, newOffMm: number) => {
    const side = sideOf(newOffMm);
    const q = new URLSearchParams({
      unit,
      move: entryId,
      toSide: side,
      ...(side === "centre" ? {} : { toOffCentre: typed(Math.abs(newOffMm), unit) }),
    });
    return `?${q}#what-if`;
  };
  return (
    <Section
      id="level"
      title="Bring her upright"
      lead={upright ? "She floats upright with this ledger: there is nothing to level." : `She lists ${describeHeel(heelDeg)}. Either move one weight across, or add a weight on the high side.`}
    >
      {!upright && (
        <>
          <div className="overflow-x-auto">
            <table className="w-full border-collapse text-step--1" data-testid="level-by-moving">
              <thead>
                <tr className="border-b border-cloth-300 text-left">
                  <th scope="col" className="py-2 pr-3">Move this alone</th>
                  <th scope="col" className="py-2 pr-3">How far across</th>
                  <th scope="col" className="py-2 pr-3">To</th>
                  <th scope="col" className="py-2"><span className="sr-only">Try it</span></th>
                </tr>
              </thead>
              <tbody>
                {plans.map((p) => (
                  <tr key={p.entryId} className="border-b border-cloth-200 align-top" data-level-item={p.name}>
                    <td className="py-2 pr-3 font-medium">{p.name} <span className="font-normal text-ink-soft">({formatWeight(p.weightKg, weightUnit)})</span></td>
                    <td className="py-2 pr-3" data-shift-mm={p.shiftMm.toFixed(1)}>{describeShift(p.shiftMm, unit)}</td>
                    <td className="py-2 pr-3">
                      {p.withinBeam ? describeOffset(p.newOffCentreMm, unit) : (
                        <span className="text-bootstripe-600">{describeOffset(p.newOffCentreMm, unit)}: outside the hull, too light to do it alone</span>
                      )}
                    </td>
                    <td className="py-2 text-right">
                      {p.withinBeam && <Link to={tryLink(p.entryId, p.newOffCentreMm)} preventScrollReset aria-label={`Try it: move ${p.name}`}>Try it</Link>}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <Form method="get" className="flex flex-wrap items-start gap-4 rounded-lg bg-cloth-100 p-4" aria-label="Weight to add" preventScrollReset>
            <input type="hidden" name="unit" value={unit} />
            <div>
              <label htmlFor="q-addSide" className="block font-medium">Or add a weight to</label>
              <select id="q-addSide" name="addSide" value={addSide} onChange={(e) => setAddSide(e.target.value)} className={`mt-1 ${inputClass}`}>
                <option value="port">port</option>
                <option value="starboard">starboard</option>
              </select>
            </div>
            <div className="min-w-48">
              <QueryField name="addOffCentre" label="At, off the centreline" value={addOff} onChange={setAddOff} error={add.errors.addOffCentre} hint={`At most ${formatLength(limits.halfBeamMm, unit)}`} />
            </div>
            <button type="submit" className={`${buttonClass} sm:mt-7`}>How much?</button>
          </Form>
          {add.result && (
            <p className="text-step-1" role="status" data-testid="weight-to-add">
              {add.result.weightKg === null ? (
                `No weight ${describeOffset(add.result.offCentreMm, unit)} can level her: she already lists that way.`
              ) : (
                <>Add <strong>{formatWeight(add.result.weightKg, weightUnit)}</strong> {describeOffset(add.result.offCentreMm, unit)}.</>
              )}
            </p>
          )}
        </>
      )}
    </Section>
  );
}

// ---------------------------------------------------------------------------------------------
// GM from a measured list.

function CalibrationSection({ loaderData, actionData, displacementLb }: { loaderData: Loader; actionData: ActionResult; displacementLb: number | null }) {
  const { unit, owner, gm, calibrations, particulars } = loaderData;
  const weightUnit = weightUnitFor(unit);
  const schema = calibrationSchema(unitsFor(unit));
  const lastResult = actionData && "result" in actionData && actionData.intent === "calibrate" ? actionData.result : undefined;
  const [form, f] = useForm({
    id: "calibrate",
    lastResult,
    constraint: getZodConstraint(fieldsOf(schema)),
    defaultValue: { method: "angle", displacement: displacementLb === null ? "" : formatPounds(displacementLb, unit) },
    onValidate: ({ formData }) => parseWithZod(formData, { schema }),
    shouldValidate: "onBlur",
    shouldRevalidate: "onInput",
  });
  const method = f.method.value ?? "angle";
  return (
    <Section
      id="gm"
      title="Her own GM, from a measured list"
      lead="Move a known weight a known distance across, measure the change of list (a level, an inclinometer, or a plumb line against a batten), and her GM follows from the inclining relation. It then replaces the class figure for this boat."
    >
      <p data-testid="gm-in-use">
        GM in use: <strong>{gm.mm === null ? "none" : formatGm(gm.mm, unit)}</strong>{" "}
        {gm.source === "calibrated" ? "(measured on this boat)" : `(the class figure${particulars?.demo ? ", an invented demo value" : ""})`}.
      </p>
      {calibrations.length > 0 && (
        <ul className="space-y-1 text-step--1">
          {calibrations.map((c, n) => (
            <li key={c.id} className={n === 0 ? "" : "text-ink-soft"}>
              {new Date(c.createdAt).toISOString().slice(0, 10)}{c.by ? `, ${c.by}` : ""}: {formatWeight(c.weightKg, weightUnit)} moved {formatLength(c.shiftMm, unit)} across at{" "}
              {formatWeight(c.displacementKg, weightUnit)}, list{" "}
              {c.heelDeg !== null ? `${c.heelDeg}°` : `${formatLength(c.deflectionMm as number, unit)} over ${formatLength(c.plumbLengthMm as number, unit)} of plumb line`}: GM {formatGm(c.gmMm, unit)}
              {n === 0 ? " (in use)" : ""}
            </li>
          ))}
        </ul>
      )}
      {owner && (
        <div className="space-y-3">
          <Form method="post" {...getFormProps(form)} className="space-y-4 rounded-lg border border-cloth-200 bg-white/70 p-4" preventScrollReset aria-label="Measure her GM">
            <input type="hidden" name="intent" value="calibrate" />
            <input type="hidden" name="unit" value={unit} />
            <FormMessage errors={form.errors} id={form.errorId} />
            <div className="grid gap-4 sm:grid-cols-3">
              <TextField field={f.weight} label="Weight moved" hint="e.g. a crew member, a water can" />
              <TextField field={f.shift} label="Moved across by" hint="Athwartships, from one side to the other" />
              <TextField field={f.displacement} label="Displacement during the test" hint="The light boat plus the ledger, as filled in" />
            </div>
            <fieldset>
              <legend className="font-medium">The list measured as</legend>
              <div className="mt-1 flex flex-wrap gap-4">
                <label className="flex min-h-11 items-center gap-2">
                  <input {...getInputProps(f.method, { type: "radio", value: "angle" })} key={`${f.method.key}-angle`} className="size-5 accent-deep-700" />
                  an angle
                </label>
                <label className="flex min-h-11 items-center gap-2">
                  <input {...getInputProps(f.method, { type: "radio", value: "plumb" })} key={`${f.method.key}-plumb`} className="size-5 accent-deep-700" />
                  a plumb line's deflection
                </label>
              </div>
            </fieldset>
            {method === "plumb" ? (
              <div className="grid gap-4 sm:grid-cols-2">
                <TextField field={f.deflection} label="Deflection along the batten" />
                <TextField field={f.plumbLength} label="Plumb line length" hint="From the pivot to the batten" />
              </div>
            ) : (
              <div className="grid gap-4 sm:grid-cols-3">
                <TextField field={f.heel} label="Change of list, degrees" hint="e.g. 1.6" />
              </div>
            )}
            <button type="submit" className={buttonClass}>Work out and use this GM</button>
          </Form>
          {gm.source === "calibrated" && (
            <Form method="post" preventScrollReset>
              <input type="hidden" name="unit" value={unit} />
              <button type="submit" name="intent" value="clear-calibration" className={quietButtonClass}>Use the class GM again</button>
            </Form>
          )}
        </div>
      )}
    </Section>
  );
}
