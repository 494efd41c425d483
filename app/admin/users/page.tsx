import type { Metadata } from "next";
import type { Column } from "@/app/_ui/kit";
import { DataTable, StatusMark } from "@/app/_ui/kit";
import { listUsers } from "@/lib/auth/user.store";
import { when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { HistoryLink, NoSite, Note } from "@/app/_ui/ui";
import {
  ChangeAccountForm,
  CreateAccountForm,
  EndSessionsForm,
  ResetPasswordForm,
  UnlockSignInForm,
} from "@/app/admin/users/account-forms";

type AccountRow = Awaited<ReturnType<typeof listUsers>>[number];

const accountColumns = (tz: string): Column<AccountRow>[] => [
  { key: "login", header: "User name", cell: (u) => <span className="code">{u.login}</span> },
  { key: "name", header: "Name", cell: (u) => u.fullName },
  { key: "role", header: "Role", cell: (u) => ROLE_WORDS[u.role] ?? u.role },
  { key: "units", header: "Units", cell: (u) => (u.unitSystem === "us" ? "US" : "Metric") },
  {
    key: "account",
    header: "Account",
    cell: (u) =>
      u.active ? <StatusMark code="OPEN_PERIOD" label="Active" /> : <StatusMark code="CLOSED" label="Disabled" />,
  },
  { key: "sessions", header: "Live sessions", numeric: true, cell: (u) => u.liveSessions },
  { key: "signin", header: "Last sign-in", cell: (u) => <span className="nowrap">{when(u.lastSignIn, tz)}</span> },
  {
    key: "manage",
    header: "Manage",
    cell: (u) => (
      <details>
        <summary>Manage {u.login}</summary>
        <ChangeAccountForm login={u.login} role={u.role} active={u.active} unitSystem={u.unitSystem} />
        <ResetPasswordForm login={u.login} />
        <EndSessionsForm login={u.login} />
        <UnlockSignInForm login={u.login} />
      </details>
    ),
  },
  { key: "history", header: "History", cell: (u) => <HistoryLink kind="user" recordKey={u.login} label="account" /> },
];

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Accounts" };

const ROLE_WORDS: Readonly<Record<string, string>> = {
  COLLECTOR: "Collector",
  PRODUCTION: "Production",
  COMPLIANCE: "Compliance",
  ADMIN: "Administrator",
};

export default async function AccountsPage() {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  if (user.role !== "ADMIN") {
    return (
      <>
        <h1>Accounts</h1>
        <p className="form-error" role="alert">
          Only an administrator manages accounts. Ask your administrator to add a colleague, change a role or end a lost
          phone&apos;s session.
        </p>
      </>
    );
  }
  const users = await listUsers(db, site.id, user.now);
  const tz = site.timeZone;
  return (
    <>
      <h1>Accounts</h1>
      <p className="lede">
        Who can sign in, in which role. Accounts are never deleted — a leaver is disabled, which ends their sessions at
        once, and their name stays on everything they recorded. Each change needs a reason and is kept in the audit
        trail.
      </p>
      <DataTable
        caption="Accounts"
        hideCaption
        columns={accountColumns(tz)}
        rows={users}
        rowKey={(u) => u.login}
        empty="No accounts yet."
      />
      <h2>New account</h2>
      <CreateAccountForm />
      <Note>
        Passwords: at least 8 characters, any characters; a long phrase is easier to type on a phone than a short
        complicated word.
      </Note>
    </>
  );
}
