import { getFormProps, getInputProps, useForm } from "@conform-to/react";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { useState } from "react";
import { data, Form, Link, useNavigation } from "react-router";
import type { Route } from "./+types/admin.tags";
import { buttonClass, FieldError, inputClass, Notice, TextField } from "~/components/ui/field";
import { db } from "~/db/index.server";
import { systemFieldsSchema, systemSchema, systemSlugFrom } from "~/domain/conversation-forms";
import { addSystem } from "~/models/writeup-editing.server";
import { listSystemsWithCounts } from "~/models/writeups.server";
import { readNotice, redirectWithNotice, requirePermission } from "~/services/session.server";
import { readForm } from "~/services/form-body.server";

export function meta() {
  return [{ title: "Boat systems · Sistership" }];
}

export async function loader({ request }: Route.LoaderArgs) {
  await requirePermission(request, "tag:manage");
  const [systems, { notice, headers }] = await Promise.all([listSystemsWithCounts(db), readNotice(request)]);
  return data({ systems, notice }, { headers });
}

// "Heel & trim" and "heel and trim" are the same name: compare the words, not the spelling.
const sameName = (a: string, b: string) =>
  a.trim().toLocaleLowerCase("en") === b.trim().toLocaleLowerCase("en") || (systemSlugFrom(a) !== "" && systemSlugFrom(a) === systemSlugFrom(b));

export async function action({ request }: Route.ActionArgs) {
  await requirePermission(request, "tag:manage");
  const submission = parseWithZod(await readForm(request), { schema: systemSchema });
  if (submission.status !== "success") return data({ result: submission.reply() }, { status: 400 });
  const { name, slug, description } = submission.value;
  const existing = await listSystemsWithCounts(db);
  const byName = existing.find((sys) => sameName(sys.name, name));
  if (byName) {
    return data(
      { result: submission.reply({ fieldErrors: { name: [`There is already a system called ${byName.name}. Tag write-ups with it, or choose another name.`] } }) },
      { status: 400 },
    );
  }
  const bySlug = existing.find((sys) => sys.slug === slug);
  if (bySlug || !(await addSystem(db, slug, name, description))) {
    const taken = bySlug ? ` by ${bySlug.name}` : "";
    return data(
      { result: submission.reply({ fieldErrors: { slug: [`The address /systems/${slug} is taken${taken}. Type another one.`] } }) },
      { status: 400 },
    );
  }
  return redirectWithNotice(request, "/admin/tags", `${name} is added. Authors can tag write-ups with it now.`);
}

export default function AdminTags({ loaderData, actionData }: Route.ComponentProps) {
  const { systems, notice } = loaderData;
  const navigation = useNavigation();
  const [form, fields] = useForm({
    id: "add-system",
    lastResult: navigation.state === "idle" ? actionData?.result : undefined,
    constraint: getZodConstraint(systemFieldsSchema),
    onValidate: ({ formData }) => parseWithZod(formData, { schema: systemSchema }),
    shouldValidate: "onBlur",
    shouldRevalidate: "onInput",
  });
  const [typedName, setTypedName] = useState(typeof fields.name.initialValue === "string" ? fields.name.initialValue : "");
  const derived = systemSlugFrom(typedName);
  const slugProps = getInputProps(fields.slug, { type: "text", ariaDescribedBy: `${fields.slug.id}-hint` });
  return (
    <div className="space-y-8">
      <header className="space-y-2">
        <h1 className="text-step-3 font-semibold">Boat systems</h1>
        <p className="max-w-2xl text-ink-soft">
          The systems write-ups are tagged with. Each has a page of its own at /systems/… listing its published write-ups.
          A system cannot be renamed or removed here yet, so check the spelling before adding one.
        </p>
        <p className="text-step--1"><Link to="/admin/users">Members and roles</Link></p>
      </header>
      {notice && <Notice>{notice}</Notice>}

      <div className="overflow-x-auto">
        <table className="w-full border-collapse text-left text-step--1">
          <thead>
            <tr className="border-b border-cloth-300">
              <th scope="col" className="py-2 pr-3">System</th>
              <th scope="col" className="py-2 pr-3">Address</th>
              <th scope="col" className="py-2 pr-3">What it covers</th>
              <th scope="col" className="py-2 text-right">Published write-ups</th>
            </tr>
          </thead>
          <tbody>
            {systems.map((sys) => (
              <tr key={sys.slug} className="border-b border-cloth-200 align-top">
                <td className="py-2 pr-3 font-medium"><Link to={`/systems/${sys.slug}`}>{sys.name}</Link></td>
                <td className="py-2 pr-3 font-mono text-ink-soft">{sys.slug}</td>
                <td className="py-2 pr-3">{sys.description}</td>
                <td className="py-2 text-right tabular-nums">{sys.count}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>

      <section className="max-w-xl rounded-lg border border-cloth-200 bg-white/70 p-5">
        <h2 className="text-step-1 font-semibold">Add a system</h2>
        <Form method="post" {...getFormProps(form)} className="mt-4 space-y-4">
          <div onInput={(e) => { if ((e.target as HTMLInputElement).name === fields.name.name) setTypedName((e.target as HTMLInputElement).value); }}>
            <TextField field={fields.name} label="Name" hint="As readers see it on tags, such as Ventilation." autoComplete="off" />
          </div>
          <div>
            <label htmlFor={fields.slug.id} className="block font-medium">Address</label>
            <p id={`${fields.slug.id}-hint`} className="text-step--1 text-ink-soft">
              Made from the name{derived ? <>: <span className="font-mono">/systems/{derived}</span></> : ""}. Type one only to change it.
            </p>
            <input {...slugProps} key={slugProps.key} placeholder={derived || undefined} autoComplete="off" className={`mt-1 font-mono ${inputClass}`} />
            <FieldError id={fields.slug.errorId} errors={fields.slug.errors} />
          </div>
          <TextField field={fields.description} label="What it covers (optional)" hint="One line, shown on the system's page." autoComplete="off" />
          <button type="submit" className={buttonClass} disabled={navigation.state !== "idle"}>Add the system</button>
        </Form>
      </section>
    </div>
  );
}
