"use client";
import {
  changeUserAction,
  createUserAction,
  endSessionsAction,
  resetPasswordAction,
  unlockSignInAction,
} from "@/app/admin/users/actions";
import { ActionForm, Field } from "@/app/_ui/kit/action-form";

const ROLE_WORDS: ReadonlyArray<readonly [string, string]> = [
  ["COLLECTOR", "Collector"],
  ["PRODUCTION", "Production"],
  ["COMPLIANCE", "Compliance"],
  ["ADMIN", "Administrator"],
];

export function CreateAccountForm() {
  return (
    <ActionForm action={createUserAction} label="New account" submitLabel="Create account" className="account-form">
      <Field name="login" label="User name" />
      <Field name="fullName" label="Full name" />
      <Field name="role" label="Role" type="select" options={ROLE_WORDS} defaultValue="COLLECTOR" />
      <Field
        name="unitSystem"
        label="Units"
        type="select"
        options={[
          ["metric", "Metric (kg, L, °C)"],
          ["us", "US (lb, gal, °F)"],
        ]}
        defaultValue="metric"
      />
      <Field name="password" label="First password" type="password" autoComplete="new-password" />
    </ActionForm>
  );
}

/** Role, units and active state of one account; every change needs a reason. */
export function ChangeAccountForm({
  login,
  role,
  active,
  unitSystem,
}: {
  login: string;
  role: string;
  active: boolean;
  unitSystem: string;
}) {
  return (
    <ActionForm
      action={changeUserAction}
      label={`Change ${login}`}
      submitLabel="Save change"
      hidden={{ login }}
      className="account-form"
    >
      <Field name="role" label="Role" type="select" options={ROLE_WORDS} defaultValue={role} />
      <Field
        name="active"
        label="Account"
        type="select"
        options={[
          ["yes", "Active"],
          ["no", "Disabled (sessions end now)"],
        ]}
        defaultValue={active ? "yes" : "no"}
      />
      <Field
        name="unitSystem"
        label="Units"
        type="select"
        options={[
          ["metric", "Metric"],
          ["us", "US"],
        ]}
        defaultValue={unitSystem}
      />
      <Field name="reason" label="Reason" />
    </ActionForm>
  );
}

export function ResetPasswordForm({ login }: { login: string }) {
  return (
    <ActionForm
      action={resetPasswordAction}
      label={`New password for ${login}`}
      submitLabel="Set password"
      hidden={{ login }}
      className="account-form"
    >
      <Field name="password" label="New password" type="password" autoComplete="new-password" />
      <Field name="reason" label="Reason" />
    </ActionForm>
  );
}

export function EndSessionsForm({ login }: { login: string }) {
  return (
    <ActionForm
      action={endSessionsAction}
      label={`End sessions of ${login}`}
      submitLabel="End all sessions"
      hidden={{ login }}
      className="account-form"
    >
      <Field name="reason" label="Reason" />
    </ActionForm>
  );
}

/** Lifts a sign-in lock after failed attempts (for example a colleague who forgot the password and then remembered). */
export function UnlockSignInForm({ login }: { login: string }) {
  return (
    <ActionForm
      action={unlockSignInAction}
      label={`Unlock sign-in of ${login}`}
      submitLabel="Unlock sign-in"
      hidden={{ login }}
      className="account-form"
    >
      <Field name="reason" label="Reason" />
    </ActionForm>
  );
}
