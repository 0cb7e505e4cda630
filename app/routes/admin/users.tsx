import { data, Form, useNavigation } from "react-router";
import type { Route } from "./+types/users";
import { Badge } from "~/components/Badge";
import { Button } from "~/components/Button";
import { controlClass, FormError } from "~/components/Field";
import { AdminNav } from "~/components/AdminNav";
import { PageHeader } from "~/components/PageHeader";
import { Pagination } from "~/components/Pagination";
import { Notice } from "~/auth/AuthPanel";
import { fieldErrors, formObject, RolesForm, StatusForm } from "~/auth/forms";
import { ROLE_LABELS, ROLES } from "~/auth/roles";
import { listAccounts, setAccountRoles, setAccountStatus, type AccountRow } from "~/auth/admin.server";
import { assertSameOrigin } from "~/auth/csrf.server";
import { readPageForm } from "~/http/body.server";
import { requireRole } from "~/auth/guards.server";
import { dayText } from "@shared/dates";

export const meta: Route.MetaFunction = () => [{ title: "Accounts · Admin · Loadline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const admin = await requireRole(request, "admin");
  const url = new URL(request.url);
  const query = (url.searchParams.get("q") ?? "").slice(0, 200);
  const page = Math.max(1, Math.min(10_000, Number.parseInt(url.searchParams.get("page") ?? "1", 10) || 1));
  return { adminId: admin.id, query, page, ...(await listAccounts({ query, page })) };
}

export async function action({ request }: Route.ActionArgs) {
  assertSameOrigin(request);
  const admin = await requireRole(request, "admin");
  const form = await readPageForm(request);
  const intent = form.get("intent");
  const userId = String(form.get("userId") ?? "");
  if (intent === "roles") {
    const parsed = RolesForm.safeParse(formObject(form, ["roles"]));
    if (!parsed.success) return data({ userId, ok: false, message: Object.values(fieldErrors(parsed.error))[0] }, { status: 400 });
    const result = await setAccountRoles(admin, parsed.data.userId, parsed.data.roles);
    return data({ userId, ...result }, { status: result.ok ? 200 : 409 });
  }
  if (intent === "status") {
    const parsed = StatusForm.safeParse(formObject(form));
    if (!parsed.success) return data({ userId, ok: false, message: Object.values(fieldErrors(parsed.error))[0] }, { status: 400 });
    const result = await setAccountStatus(admin, parsed.data.userId, parsed.data.status);
    return data({ userId, ...result }, { status: result.ok ? 200 : 409 });
  }
  return data({ userId, ok: false, message: "Unknown request." }, { status: 400 });
}

function date(iso: string | null) {
  return iso ? dayText(iso) : "never";
}

export default function AdminUsers({ loaderData, actionData }: Route.ComponentProps) {
  const { accounts, total, page, pageCount, query, adminId } = loaderData;
  const href = (p: number) => `?${new URLSearchParams({ ...(query ? { q: query } : {}), page: String(p) })}`;
  return (
    <main className="mx-auto w-full max-w-6xl space-y-6 px-4 py-10">
      <PageHeader
        overline="Admin"
        title="Accounts"
        lede={`${total} account${total === 1 ? "" : "s"}. Every account is a buyer; grant the other roles here.`}
        actions={<AdminNav />}
      />
      <Form method="get" className="flex max-w-md gap-2" role="search">
        <label htmlFor="account-search" className="sr-only">
          Find an account
        </label>
        <input
          id="account-search"
          name="q"
          type="search"
          defaultValue={query}
          placeholder="Name or e-mail address"
          className={controlClass}
        />
        <Button type="submit" variant="secondary">
          Find
        </Button>
      </Form>
      {accounts.length === 0 ? (
        <p className="text-ink-soft">No account matches “{query}”.</p>
      ) : (
        <ul className="divide-y divide-rule rounded-panel border border-rule bg-card shadow-panel">
          {accounts.map((a) => (
            <AccountItem
              key={a.id}
              account={a}
              self={a.id === adminId}
              result={actionData && actionData.userId === a.id ? actionData : null}
            />
          ))}
        </ul>
      )}
      <Pagination page={page} pageCount={pageCount} hrefFor={href} />
    </main>
  );
}

function AccountItem({
  account: a,
  self,
  result,
}: {
  account: AccountRow;
  self: boolean;
  result: { ok: boolean; message?: string } | null;
}) {
  const navigation = useNavigation();
  const busy = navigation.state === "submitting" && navigation.formData?.get("userId") === a.id;
  return (
    <li className="grid gap-4 p-4 sm:p-5 lg:grid-cols-[minmax(0,1fr)_minmax(0,1.4fr)]" aria-label={a.email}>
      <div className="min-w-0 space-y-1">
        <p className="font-medium">
          {a.displayName} {self ? <span className="text-sm font-normal text-ink-faint">(you)</span> : null}
        </p>
        <p className="truncate text-sm text-ink-soft">{a.email}</p>
        <p className="flex flex-wrap gap-1.5 pt-1">
          {a.status === "active" ? <Badge tone="trace">Active</Badge> : <Badge tone="fault">Suspended</Badge>}
          {a.emailVerified ? <Badge>E-mail confirmed</Badge> : <Badge tone="brass">E-mail not confirmed</Badge>}
        </p>
        <p className="text-xs text-ink-faint">
          Joined <span className="figures">{date(a.createdAt)}</span> · last signed in{" "}
          <span className="figures">{date(a.lastSignInAt)}</span>
        </p>
      </div>
      <div className="space-y-3">
        {result ? result.ok ? <Notice>{result.message}</Notice> : <FormError>{result.message}</FormError> : null}
        <Form method="post" key={a.roles.join(",")} className="flex flex-wrap items-center gap-x-4 gap-y-2">
          <input type="hidden" name="intent" value="roles" />
          <input type="hidden" name="userId" value={a.id} />
          <fieldset className="flex flex-wrap gap-x-4 gap-y-2">
            <legend className="sr-only">Roles of {a.displayName}</legend>
            {ROLES.map((role) => {
              // Every account is a buyer; an admin cannot take away their own admin role.
              const fixed = role === "buyer" || (self && role === "admin");
              return (
                <label key={role} className="flex items-center gap-1.5 text-sm">
                  <input
                    type="checkbox"
                    name="roles"
                    value={role}
                    defaultChecked={a.roles.includes(role)}
                    disabled={fixed}
                    title={fixed ? (role === "buyer" ? "Every account is a buyer." : "You cannot remove your own admin role.") : undefined}
                    className="size-4 accent-walnut"
                  />
                  {fixed && a.roles.includes(role) ? <input type="hidden" name="roles" value={role} /> : null}
                  {ROLE_LABELS[role]}
                </label>
              );
            })}
          </fieldset>
          <Button type="submit" size="sm" variant="secondary" busy={busy && navigation.formData?.get("intent") === "roles"}>
            Save roles
          </Button>
        </Form>
        {self ? null : (
          <Form method="post">
            <input type="hidden" name="intent" value="status" />
            <input type="hidden" name="userId" value={a.id} />
            <input type="hidden" name="status" value={a.status === "active" ? "suspended" : "active"} />
            <Button type="submit" size="sm" variant={a.status === "active" ? "quiet" : "secondary"}>
              {a.status === "active" ? "Suspend account" : "Reinstate account"}
            </Button>
          </Form>
        )}
      </div>
    </li>
  );
}
