import { getFormProps, getInputProps, getSelectProps, useForm } from "@conform-to/react";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { data, Form, Link, useActionData } from "react-router";
import type { Route } from "./+types/account";
import { buttonClass, FieldError, inputClass, Notice, quietButtonClass, TextField } from "~/components/ui/field";
import { db } from "~/db/index.server";
import { addBoatSchema, profileSchema } from "~/domain/account-forms";
import { variantOf } from "~/domain/hulls";
import { ROLE_LABELS } from "~/domain/permissions";
import { queueVerificationEmail } from "~/models/account-emails.server";
import { deleteOtherSessions, listSessions } from "~/models/sessions.server";
import { issueToken } from "~/models/tokens.server";
import { getUserById, leaveBoat, listBoatsOf, registerBoat, updateProfile } from "~/models/users.server";
import { env } from "~/services/env.server";
import { kickOutbox } from "~/services/outbox-worker.server";
import { currentSessionId, readNotice, redirectWithNotice, requireUser } from "~/services/session.server";
import { readForm } from "~/services/form-body.server";

export function meta() {
  return [{ title: "Your account · Sistership" }];
}

export async function loader({ request }: Route.LoaderArgs) {
  const sessionUser = await requireUser(request);
  const [user, boats, sessions, sid, { notice, headers }] = await Promise.all([
    getUserById(db, sessionUser.id),
    listBoatsOf(db, sessionUser.id),
    listSessions(db, sessionUser.id),
    currentSessionId(request),
    readNotice(request),
  ]);
  if (!user) throw new Response("Not found", { status: 404 });
  return data(
    {
      profile: { email: user.email, displayName: user.displayName, creditAs: user.creditAs ?? "", units: user.units, digestOptIn: user.digestOptIn, emailVerified: user.emailVerifiedAt !== null },
      roles: sessionUser.roles,
      boats: boats.map((b) => ({ ...b, variant: variantOf(b.hullNumber)?.label ?? "" })),
      sessions: sessions.map((s) => ({ current: s.id === sid, lastSeenAt: s.lastSeenAt.toISOString(), userAgent: s.userAgent, key: s.id.slice(0, 8) })),
      notice,
    },
    { headers },
  );
}

export async function action({ request }: Route.ActionArgs) {
  const user = await requireUser(request);
  const formData = await readForm(request);
  const intent = formData.get("intent");
  switch (intent) {
    case "profile": {
      const submission = parseWithZod(formData, { schema: profileSchema });
      if (submission.status !== "success") return data({ intent, result: submission.reply() }, { status: 400 });
      const { displayName, creditAs, units, digestOptIn } = submission.value;
      await updateProfile(db, user.id, { displayName, creditAs: creditAs || null, units, digestOptIn });
      return redirectWithNotice(request, "/account", "Your profile is saved.");
    }
    case "add-boat": {
      const submission = parseWithZod(formData, { schema: addBoatSchema });
      if (submission.status !== "success") return data({ intent, result: submission.reply() }, { status: 400 });
      const { hullNumber, boatName } = submission.value;
      const { alreadyOwner } = await registerBoat(db, user.id, hullNumber, boatName || null);
      if (alreadyOwner) {
        return data({ intent, result: submission.reply({ fieldErrors: { hullNumber: [`Hull ${hullNumber} is already on your list.`] } }) }, { status: 400 });
      }
      return redirectWithNotice(request, "/account", `Hull ${hullNumber} is registered to you.`);
    }
    case "leave-boat": {
      const boatId = Number(formData.get("boatId"));
      if (!Number.isInteger(boatId)) return data({ intent, error: "Choose a boat." }, { status: 400 });
      await leaveBoat(db, user.id, boatId);
      return redirectWithNotice(request, "/account", "The boat is no longer on your list.");
    }
    case "sign-out-others": {
      const n = await deleteOtherSessions(db, user.id, await currentSessionId(request));
      return redirectWithNotice(request, "/account", n === 1 ? "One other browser was signed out." : `${n} other browsers were signed out.`);
    }
    case "resend-verification": {
      const full = await getUserById(db, user.id);
      if (!full || full.emailVerifiedAt) return redirectWithNotice(request, "/account", "Your address is already confirmed.");
      await db.transaction(async (tx) => {
        const token = await issueToken(tx, full.id, "verify_email");
        await queueVerificationEmail(tx, full.email, full.displayName, `${env.APP_URL}/verify-email?token=${token}`);
      });
      kickOutbox();
      return redirectWithNotice(request, "/account", `We sent a new link to ${full.email}.`);
    }
    default:
      return data({ intent: null, error: "Unknown action." }, { status: 400 });
  }
}

function Section({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <section className="rounded-lg border border-cloth-200 bg-white/70 p-5">
      <h2 className="text-step-1 font-semibold">{title}</h2>
      <div className="mt-4">{children}</div>
    </section>
  );
}

export default function Account({ loaderData }: Route.ComponentProps) {
  const { profile, roles, boats, sessions, notice } = loaderData;
  const actionData = useActionData<typeof action>();
  const [profileForm, pf] = useForm({
    id: "profile",
    lastResult: actionData && "result" in actionData && actionData.intent === "profile" ? actionData.result : undefined,
    constraint: getZodConstraint(profileSchema),
    defaultValue: { displayName: profile.displayName, creditAs: profile.creditAs, units: profile.units, digestOptIn: profile.digestOptIn ? "on" : undefined },
    onValidate: ({ formData }) => parseWithZod(formData, { schema: profileSchema }),
    shouldValidate: "onBlur",
  });
  const [boatForm, bf] = useForm({
    id: "add-boat",
    lastResult: actionData && "result" in actionData && actionData.intent === "add-boat" ? actionData.result : undefined,
    constraint: getZodConstraint(addBoatSchema),
    onValidate: ({ formData }) => parseWithZod(formData, { schema: addBoatSchema }),
    shouldValidate: "onBlur",
  });
  return (
    <div className="mx-auto max-w-3xl space-y-6">
      <h1 className="text-step-3 font-semibold">Your account</h1>
      {notice && <Notice>{notice}</Notice>}
      {!profile.emailVerified && (
        <div className="rounded-md border-l-4 border-varnish-500 bg-cloth-100 p-3">
          <p>Your e-mail address ({profile.email}) is not confirmed yet. Open the link we sent you.</p>
          <Form method="post" className="mt-2">
            <button type="submit" name="intent" value="resend-verification" className={quietButtonClass}>Send the link again</button>
          </Form>
        </div>
      )}
      <p className="text-ink-soft">
        Signed in as {profile.email}. Roles: {roles.map((r) => ROLE_LABELS[r]).join(", ")}.
      </p>

      <Section title="Your boats">
        {boats.length === 0 ? (
          <p className="text-ink-soft">No boat registered yet. Add yours by its hull number: write-ups and measurements are then matched to your hull.</p>
        ) : (
          <ul className="divide-y divide-cloth-200">
            {boats.map((b) => (
              <li key={b.id} className="flex flex-wrap items-center justify-between gap-3 py-3">
                <div>
                  <p className="font-medium"><Link to={`/boats/${b.hullNumber}`}>Hull {b.hullNumber}{b.name ? `, ${b.name}` : ""}</Link> <span className="text-ink-soft">({b.variant})</span></p>
                  {b.owners.length > 1 && <p className="text-step--1 text-ink-soft">Owned with {b.owners.filter((o) => o.displayName !== profile.displayName).map((o) => o.displayName).join(", ")}</p>}
                </div>
                <Form method="post">
                  <input type="hidden" name="boatId" value={b.id} />
                  <button type="submit" name="intent" value="leave-boat" className={quietButtonClass}>Remove from my list</button>
                </Form>
              </li>
            ))}
          </ul>
        )}
        <Form method="post" {...getFormProps(boatForm)} key={`add-boat-${boats.length}`} className="mt-4 grid gap-3 sm:grid-cols-[8rem_1fr_auto] sm:items-start">
          <input type="hidden" name="intent" value="add-boat" />
          <TextField field={bf.hullNumber} label="Hull number" inputMode="numeric" />
          <TextField field={bf.boatName} label="Boat name (optional)" />
          <button type="submit" className={`${buttonClass} sm:mt-7`}>Add boat</button>
        </Form>
      </Section>

      <Section title="Profile">
        <Form method="post" {...getFormProps(profileForm)} className="space-y-4">
          <input type="hidden" name="intent" value="profile" />
          <TextField field={pf.displayName} label="Your name" autoComplete="name" />
          <TextField field={pf.creditAs} label="How to credit you" hint="In the yearly digest, e.g. “Ann B., hull 147”. Leave empty to use your name." />
          <div>
            <label htmlFor={pf.units.id} className="block font-medium">Units</label>
            <select {...getSelectProps(pf.units)} key={pf.units.key} className={`mt-1 ${inputClass}`}>
              <option value="in">Inches and pounds (to the nearest 1/16 in)</option>
              <option value="mm">Millimetres and kilograms</option>
            </select>
            <FieldError id={pf.units.errorId} errors={pf.units.errors} />
          </div>
          <label className="flex items-center gap-2">
            <input {...getInputProps(pf.digestOptIn, { type: "checkbox" })} key={pf.digestOptIn.key} className="h-5 w-5" />
            Send me the class's yearly digest by e-mail
          </label>
          <button type="submit" className={buttonClass}>Save profile</button>
        </Form>
      </Section>

      <Section title="Where you are signed in">
        <ul className="space-y-2 text-step--1">
          {sessions.map((s) => (
            <li key={s.key}>
              {s.userAgent || "Unknown browser"}, last seen {new Date(s.lastSeenAt).toLocaleString("en-GB", { timeZone: "UTC" })} UTC
              {s.current && <strong> (this browser)</strong>}
            </li>
          ))}
        </ul>
        <Form method="post" className="mt-4">
          <button type="submit" name="intent" value="sign-out-others" className={quietButtonClass}>Sign out everywhere else</button>
        </Form>
      </Section>
    </div>
  );
}
