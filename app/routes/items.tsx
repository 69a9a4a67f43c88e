import { getFormProps, getInputProps, getTextareaProps, useForm } from "@conform-to/react";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { data, Form, Link, useNavigation } from "react-router";
import type { Route } from "./+types/items";
import { buttonClass, FieldError, FormMessage, inputClass, Notice, TextField } from "~/components/ui/field";
import { UnitToggle } from "~/components/unit-toggle";
import { db } from "~/db/index.server";
import { describeBox } from "~/domain/fit-search";
import { CLASS_NAME } from "~/domain/hulls";
import { itemSchema } from "~/domain/items";
import { can } from "~/domain/permissions";
import { formatWeight, type LengthUnit } from "~/domain/units";
import { addItem, listItems } from "~/models/items.server";
import { getUser, readNotice, redirectWithNotice, requirePermission } from "~/services/session.server";
import { readerUnit } from "./reader-unit.server";
import { readForm } from "~/services/form-body.server";
import { keepPageForVisitors } from "~/services/page-cache.server";

export function meta() {
  return [
    { title: `Items to fit · ${CLASS_NAME} · Sistership` },
    { name: "description", content: "Battery cases by BCI group and the tanks, coolers and boxes members have measured." },
  ];
}

// Visitors who are not signed in may be answered from memory (app/services/page-cache.server.ts).
export const middleware: Route.MiddlewareFunction[] = [keepPageForVisitors];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await getUser(request);
  const unit = await readerUnit(request, user);
  const [items, { notice, headers }] = await Promise.all([listItems(db), readNotice(request)]);
  return data(
    {
      unit,
      notice,
      canAdd: user ? can(user.roles, "space:measure") : false,
      signedIn: user !== null,
      items: items.map((i) => ({
        slug: i.slug,
        name: i.name,
        kind: i.kind,
        size: describeBox(i.box, unit),
        weight: i.weightKg === null ? "" : formatWeight(i.weightKg, unit === "mm" ? "kg" : "lb"),
        upright: i.orientation === "upright",
        note: i.note,
        addedBy: i.addedBy,
      })),
    },
    { headers },
  );
}

export async function action({ request }: Route.ActionArgs) {
  const user = await requirePermission(request, "space:measure");
  const formData = await readForm(request);
  const asked = formData.get("unit");
  const unit: LengthUnit = asked === "mm" || asked === "in" ? asked : user.units;
  const submission = parseWithZod(formData, { schema: itemSchema(unit) });
  if (submission.status !== "success") return data({ result: submission.reply() }, { status: 400 });
  const v = submission.value;
  const { slug } = await addItem(db, {
    name: v.name,
    kind: "member-item",
    box: { length: v.length, width: v.width, height: v.height },
    weightKg: v.weight,
    orientation: v.orientation,
    note: v.note,
    addedBy: user.id,
  });
  return redirectWithNotice(request, `/items${unit !== user.units ? `?unit=${unit}` : ""}#item-${slug}`, `${v.name} is in the catalogue.`);
}

export default function ItemsPage({ loaderData, actionData }: Route.ComponentProps) {
  const { unit, notice, items, canAdd, signedIn } = loaderData;
  const batteries = items.filter((i) => i.kind === "battery-group");
  const others = items.filter((i) => i.kind !== "battery-group");
  const list = (rows: typeof items) => (
    <ul className="mt-3 grid gap-3 md:grid-cols-2">
      {rows.map((i) => (
        <li key={i.slug} id={`item-${i.slug}`} className="rounded-lg border border-cloth-200 bg-white/70 p-4 text-step--1">
          <p className="font-serif text-step-1 font-semibold text-deep-900">{i.name}</p>
          <p className="mt-1 tabular-nums">
            {i.size}{i.weight ? ` · ${i.weight}` : ""} · {i.upright ? "upright only" : "any way up"}
          </p>
          {i.note && <p className="mt-1 text-ink-soft">{i.note}</p>}
          <p className="mt-2 flex flex-wrap justify-between gap-2">
            <Link to={`/fit?item=${i.slug}&unit=${unit}`} className="font-medium">Where does it fit?</Link>
            {i.addedBy && <span className="text-ink-soft">Added by {i.addedBy}</span>}
          </p>
        </li>
      ))}
    </ul>
  );
  return (
    <div className="space-y-10">
      <header className="max-w-3xl">
        <h1 className="text-step-4 font-semibold leading-tight">Items to fit</h1>
        <p className="mt-3 font-serif text-step-1 leading-relaxed text-ink-soft">
          Outside sizes of things members want to stow: battery cases by BCI group, and the tanks, coolers and boxes members
          have measured. Length × width × height, height as the item stands.
        </p>
        <div className="mt-4"><UnitToggle unit={unit} /></div>
      </header>
      {notice && <Notice>{notice}</Notice>}
      <section aria-labelledby="batteries-heading">
        <h2 id="batteries-heading" className="text-step-2 font-semibold">Batteries by BCI group</h2>
        <p className="mt-2 max-w-3xl text-step--1 text-ink-soft">
          The largest case of each group in the BCI group size chart. Cases vary by maker and are at or under these sizes:
          measure yours and type its size on the fit page.
        </p>
        {list(batteries)}
      </section>
      <section aria-labelledby="members-items-heading">
        <h2 id="members-items-heading" className="text-step-2 font-semibold">Members' items</h2>
        {list(others)}
      </section>
      <section aria-labelledby="add-item-heading" className="max-w-2xl">
        <h2 id="add-item-heading" className="text-step-2 font-semibold">Add an item</h2>
        {canAdd ? (
          <AddItem unit={unit} actionData={actionData} />
        ) : (
          <p className="mt-3 rounded-lg bg-cloth-100 p-4">
            {signedIn ? "Your account cannot add items." : <><Link to="/sign-in?redirectTo=%2Fitems%23add-item-heading" className="font-medium">Sign in</Link> to add an item you have measured.</>}
          </p>
        )}
      </section>
    </div>
  );
}

function AddItem({ unit, actionData }: { unit: LengthUnit; actionData: Route.ComponentProps["actionData"] }) {
  const navigation = useNavigation();
  const schema = itemSchema(unit);
  const [form, fields] = useForm({
    id: "add-item",
    lastResult: actionData?.result,
    constraint: getZodConstraint(schema),
    defaultValue: { orientation: "any" },
    onValidate: ({ formData }) => parseWithZod(formData, { schema }),
    shouldValidate: "onBlur",
    shouldRevalidate: "onInput",
  });
  const unitWord = unit === "in" ? "inches" : "millimetres";
  const note = getTextareaProps(fields.note);
  return (
    <Form method="post" {...getFormProps(form)} className="mt-4 space-y-4 rounded-lg border border-cloth-200 bg-white/70 p-4 sm:p-6">
      <input type="hidden" name="unit" value={unit} />
      <FormMessage id={form.errorId} errors={form.errors} />
      <TextField field={fields.name} label="Name" hint="What it is, with its capacity: “Cooler, hard-sided, 24 quart”." />
      <div className="grid gap-4 sm:grid-cols-3">
        <TextField field={fields.length} label="Length" hint={`Outside, in ${unitWord} unless you type a unit`} />
        <TextField field={fields.width} label="Width" hint="Across" />
        <TextField field={fields.height} label="Height" hint="As it stands" />
      </div>
      <TextField field={fields.weight} label="Weight, as used (optional)" hint={unit === "mm" ? "In kg unless you type lb" : "In lb unless you type kg"} />
      <fieldset>
        <legend className="font-medium">Which way up</legend>
        <div className="mt-1 grid gap-2 sm:grid-cols-2">
          {([["any", "Any way up (may lie on its side)"], ["upright", "Must stay upright"]] as const).map(([value, label]) => {
            const props = getInputProps(fields.orientation, { type: "radio", value });
            return (
              <label key={value} className="flex min-h-12 cursor-pointer items-center gap-2 rounded-md border border-cloth-300 bg-white px-3 py-2 has-[:checked]:border-deep-700 has-[:checked]:bg-deep-50">
                <input {...props} key={props.key} id={`${fields.orientation.id}-${value}`} className="size-5 accent-deep-700" />
                {label}
              </label>
            );
          })}
        </div>
        <FieldError id={fields.orientation.errorId} errors={fields.orientation.errors} />
      </fieldset>
      <div>
        <label htmlFor={fields.note.id} className="block font-medium">Note (optional)</label>
        <textarea {...note} key={note.key} rows={3} className={`mt-1 ${inputClass}`} />
        <FieldError id={fields.note.errorId} errors={fields.note.errors} />
      </div>
      <button type="submit" className={buttonClass} disabled={navigation.state === "submitting"}>
        {navigation.state === "submitting" ? "Adding…" : "Add to the catalogue"}
      </button>
    </Form>
  );
}
