import type { Metadata } from "next";
import { listUsers } from "@/lib/auth/user.store";
import { when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { HistoryLink, NoSite, Note } from "@/app/_ui/ui";
import { ChangeAccountForm, CreateAccountForm, EndSessionsForm, ResetPasswordForm, UnlockSignInForm } from "@/app/admin/users/account-forms";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Accounts" };

const ROLE_WORDS: Readonly<Record<string, string>> = { COLLECTOR: "Collector", PRODUCTION: "Production", COMPLIANCE: "Compliance", ADMIN: "Administrator" };

export default async function AccountsPage() {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  if (user.role !== "ADMIN") {
    return (
      <>
        <h1>Accounts</h1>
        <p className="form-error" role="alert">
          Only an administrator manages accounts. Ask your administrator to add a colleague, change a role or end a lost phone&apos;s session.
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
        Who can sign in, in which role. Accounts are never deleted — a leaver is disabled, which ends their sessions at once, and their name stays on
        everything they recorded. Each change needs a reason and is kept in the audit trail.
      </p>
      <div className="table-wrap">
        <table>
          <thead>
            <tr>
              <th scope="col">User name</th>
              <th scope="col">Name</th>
              <th scope="col">Role</th>
              <th scope="col">Units</th>
              <th scope="col">Account</th>
              <th scope="col" className="num">
                Live sessions
              </th>
              <th scope="col">Last sign-in</th>
              <th scope="col">Manage</th>
              <th scope="col">History</th>
            </tr>
          </thead>
          <tbody>
            {users.map((u) => (
              <tr key={u.login}>
                <td className="code">{u.login}</td>
                <td>{u.fullName}</td>
                <td>{ROLE_WORDS[u.role] ?? u.role}</td>
                <td>{u.unitSystem === "us" ? "US" : "Metric"}</td>
                <td>{u.active ? <span className="status status-open-period">Active</span> : <span className="status status-closed">Disabled</span>}</td>
                <td className="num">{u.liveSessions}</td>
                <td className="nowrap">{when(u.lastSignIn, tz)}</td>
                <td>
                  <details>
                    <summary>Manage {u.login}</summary>
                    <ChangeAccountForm login={u.login} role={u.role} active={u.active} unitSystem={u.unitSystem} />
                    <ResetPasswordForm login={u.login} />
                    <EndSessionsForm login={u.login} />
                    <UnlockSignInForm login={u.login} />
                  </details>
                </td>
                <td>
                  <HistoryLink kind="user" recordKey={u.login} label="account" />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <h2>New account</h2>
      <CreateAccountForm />
      <Note>Passwords: at least 8 characters, any characters; a long phrase is easier to type on a phone than a short complicated word.</Note>
    </>
  );
}
