import { parseWithZod } from "@conform-to/zod/v4";
import { data, Form, Link, useNavigation } from "react-router";
import type { Route } from "./+types/admin.users";
import { buttonClass, inputClass, Notice, quietButtonClass } from "~/components/ui/field";
import { db } from "~/db/index.server";
import { rolesSchema } from "~/domain/account-forms";
import { isRole, ROLE_LABELS, ROLES, type Role } from "~/domain/permissions";
import { countAdmins, listUsers, setRoles } from "~/models/users.server";
import { readNotice, redirectWithNotice, requirePermission } from "~/services/session.server";
import { readForm } from "~/services/form-body.server";

export function meta() {
  return [{ title: "Members and roles · Sistership" }];
}

export async function loader({ request }: Route.LoaderArgs) {
  await requirePermission(request, "user:manage");
  const url = new URL(request.url);
  const q = (url.searchParams.get("q") ?? "").trim().slice(0, 100);
  const roleParam = url.searchParams.get("role") ?? "";
  const role = isRole(roleParam) ? roleParam : undefined;
  const page = Math.max(1, Math.min(10_000, Number.parseInt(url.searchParams.get("page") ?? "1", 10) || 1));
  const [list, { notice, headers }] = await Promise.all([listUsers(db, { q, role, page }), readNotice(request)]);
  return data({ ...list, q, role: role ?? "", notice }, { headers });
}

export async function action({ request }: Route.ActionArgs) {
  const admin = await requirePermission(request, "user:manage");
  const submission = parseWithZod(await readForm(request), { schema: rolesSchema });
  if (submission.status !== "success") return data({ error: "Choose roles from the list." }, { status: 400 });
  const { userId, roles } = submission.value;
  if (userId === admin.id && !roles.includes("admin") && (await countAdmins(db)) <= 1) {
    return data({ error: "You are the only administrator: make someone else an administrator first." }, { status: 400 });
  }
  await setRoles(db, userId, roles as Role[]);
  const back = new URL(request.url);
  return redirectWithNotice(request, `${back.pathname}${back.search}`, "Roles saved.");
}

export default function AdminUsers({ loaderData, actionData }: Route.ComponentProps) {
  const { rows, total, page, pages, q, role, notice } = loaderData;
  const navigation = useNavigation();
  const pageLink = (p: number) => `?${new URLSearchParams({ ...(q ? { q } : {}), ...(role ? { role } : {}), page: String(p) })}`;
  return (
    <div className="space-y-6">
      <h1 className="text-step-3 font-semibold">Members and roles</h1>
      <p className="text-step--1"><Link to="/admin/tags">Boat systems (tags)</Link></p>
      {notice && <Notice>{notice}</Notice>}
      {actionData?.error && <p role="alert" className="font-medium text-bootstripe-600">{actionData.error}</p>}
      <Form method="get" className="flex flex-wrap items-end gap-3" role="search">
        <div>
          <label htmlFor="q" className="block font-medium">Name or e-mail</label>
          <input id="q" name="q" type="search" defaultValue={q} className={`mt-1 ${inputClass}`} />
        </div>
        <div>
          <label htmlFor="role" className="block font-medium">Role</label>
          <select id="role" name="role" defaultValue={role} className={`mt-1 ${inputClass}`}>
            <option value="">Any role</option>
            {ROLES.map((r) => <option key={r} value={r}>{ROLE_LABELS[r]}</option>)}
          </select>
        </div>
        <button type="submit" className={buttonClass}>Show</button>
      </Form>
      <p className="text-ink-soft">{total} {total === 1 ? "account" : "accounts"}{pages > 1 ? `, page ${page} of ${pages}` : ""}.</p>
      <div className="overflow-x-auto">
        <table className="w-full border-collapse text-left text-step--1">
          <thead>
            <tr className="border-b border-cloth-300">
              <th scope="col" className="py-2 pr-3">Name</th>
              <th scope="col" className="py-2 pr-3">E-mail</th>
              <th scope="col" className="py-2 pr-3">Hulls</th>
              <th scope="col" className="py-2 pr-3">Roles</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((u) => (
              <tr key={u.id} className="border-b border-cloth-200 align-top">
                <td className="py-2 pr-3 font-medium">{u.displayName}</td>
                <td className="py-2 pr-3">{u.email}{u.emailVerified ? "" : <span className="block text-ink-soft">not confirmed</span>}</td>
                <td className="py-2 pr-3 tabular-nums">{u.hulls.join(", ")}</td>
                <td className="py-2 pr-3">
                  <Form method="post" className="flex flex-wrap items-center gap-3" aria-label={`Roles of ${u.displayName}`}>
                    <input type="hidden" name="userId" value={u.id} />
                    {ROLES.filter((r) => r !== "member").map((r) => (
                      <label key={r} className="flex items-center gap-1">
                        <input type="checkbox" name="roles" value={r} defaultChecked={u.roles.includes(r)} />
                        {ROLE_LABELS[r]}
                      </label>
                    ))}
                    <button type="submit" className={quietButtonClass} disabled={navigation.state !== "idle"}>Save</button>
                  </Form>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {pages > 1 && (
        <nav aria-label="Pages" className="flex gap-3">
          {page > 1 && <Link to={pageLink(page - 1)}>← Previous</Link>}
          {page < pages && <Link to={pageLink(page + 1)}>Next →</Link>}
        </nav>
      )}
    </div>
  );
}
