import { getFormProps, useForm } from "@conform-to/react";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { data, Form, Link, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/secretary.digest";
import { buttonClass, Notice, TextField } from "~/components/ui/field";
import { db } from "~/db/index.server";
import { formatDigestDate } from "~/domain/digest";
import { compileSchema } from "~/domain/digest-forms";
import { compileDraft, DigestError, listDigestYears } from "~/models/digests.server";
import { readNotice, requirePermission } from "~/services/session.server";
import { readForm } from "~/services/form-body.server";

export function meta() {
  return [{ title: "Yearly digest · Sistership" }];
}

export async function loader({ request }: Route.LoaderArgs) {
  await requirePermission(request, "digest:compile");
  const [years, { notice, headers }] = await Promise.all([listDigestYears(db), readNotice(request)]);
  const now = new Date();
  // The year to suggest: the last complete year with write-ups, else the newest.
  const suggested = years.find((y) => y.year < now.getUTCFullYear() && y.writeups > 0)?.year ?? years[0]?.year ?? now.getUTCFullYear();
  return data({
    notice,
    suggested,
    years: years.map((y) => ({
      year: y.year,
      writeups: y.writeups,
      editions: y.editions.map((e) => ({ edition: e.edition, status: e.status, issuedAt: e.issuedAt?.toISOString() ?? null, mailedCount: e.mailedCount })),
    })),
  }, { headers });
}

export async function action({ request }: Route.ActionArgs) {
  const user = await requirePermission(request, "digest:compile");
  const formData = await readForm(request);
  const submission = parseWithZod(formData, { schema: compileSchema });
  if (submission.status !== "success") return data({ result: submission.reply() }, { status: 400 });
  try {
    await compileDraft(db, { year: submission.value.year, userId: user.id });
  } catch (error) {
    if (error instanceof DigestError && error.field === "year") {
      return data({ result: submission.reply({ fieldErrors: { year: [error.message] } }) }, { status: 400 });
    }
    throw error;
  }
  return redirect(`/secretary/digest/${submission.value.year}`);
}

export default function SecretaryDigest({ loaderData, actionData }: Route.ComponentProps) {
  const { years, suggested, notice } = loaderData;
  const navigation = useNavigation();
  const [form, fields] = useForm({
    id: "compile",
    lastResult: actionData?.result,
    constraint: getZodConstraint(compileSchema),
    defaultValue: { year: String(suggested) },
    onValidate: ({ formData }) => parseWithZod(formData, { schema: compileSchema }),
    shouldValidate: "onBlur",
  });
  return (
    <div className="mx-auto max-w-3xl space-y-8">
      <header>
        <p className="text-step--1 font-medium uppercase tracking-wider text-deep-500">Class secretary</p>
        <h1 className="mt-1 text-step-3 font-semibold">The yearly digest</h1>
        <p className="mt-2 max-w-prose text-ink-soft">
          Pick a year: Sistership gathers the write-ups published in it, by system, with the class's figures. You put them
          in order, leave out what does not belong, write the letter, preview, and issue. Issuing e-mails every member who
          asked for the digest and adds it to the <Link to="/digest">public archive</Link>, where it never changes.
        </p>
      </header>
      {notice && <Notice>{notice}</Notice>}

      <Form method="post" {...getFormProps(form)} className="flex flex-wrap items-end gap-3 rounded-lg border border-cloth-200 bg-white p-4">
        <div className="w-40">
          <TextField field={fields.year} label="Year" inputMode="numeric" />
        </div>
        <button type="submit" className={buttonClass} disabled={navigation.state !== "idle"}>Compile the digest</button>
        <p className="basis-full text-step--1 text-ink-soft">If the year already has a draft, you go on with it; if it was issued, you start a correction (a new edition).</p>
      </Form>

      <section aria-labelledby="years-heading">
        <h2 id="years-heading" className="text-step-1 font-semibold">Years with write-ups</h2>
        {years.length === 0 ? (
          <p className="mt-2 text-ink-soft">No write-up has been published yet.</p>
        ) : (
          <table className="mt-3 w-full border-collapse text-left">
            <thead className="text-step--1 text-ink-soft">
              <tr><th className="py-2 pr-4 font-medium">Year</th><th className="py-2 pr-4 font-medium">Published write-ups</th><th className="py-2 font-medium">Digest</th></tr>
            </thead>
            <tbody>
              {years.map((y) => (
                <tr key={y.year} className="border-t border-cloth-200 align-top">
                  <th scope="row" className="py-2 pr-4 font-serif text-step-1 font-semibold text-deep-900">{y.year}</th>
                  <td className="py-3 pr-4">{y.writeups}</td>
                  <td className="py-3">
                    {y.editions.length === 0 && <span className="text-ink-soft">Not compiled</span>}
                    <ul className="space-y-1">
                      {y.editions.map((e) => (
                        <li key={e.edition}>
                          {e.status === "draft" ? (
                            <Link to={`/secretary/digest/${y.year}`}>Edition {e.edition}: draft, go on editing</Link>
                          ) : (
                            <>
                              <Link to={`/digest/${y.year}?edition=${e.edition}`} className="underline">Edition {e.edition}</Link>
                              {" "}issued {e.issuedAt ? formatDigestDate(e.issuedAt) : ""}
                              {e.mailedCount !== null ? `, e-mailed to ${e.mailedCount} member${e.mailedCount === 1 ? "" : "s"}` : ", not e-mailed"}
                            </>
                          )}
                        </li>
                      ))}
                    </ul>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
    </div>
  );
}
