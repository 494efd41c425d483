import type { Metadata } from "next";
import { loadSite } from "@/app/_ui/site";
import { ActionForm, Field } from "@/app/_ui/kit/action-form";
import { changeOwnPasswordAction } from "@/app/me/actions";
import { MAX_PASSWORD_LENGTH, MIN_PASSWORD_LENGTH } from "@/lib/auth/password";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Your password" };

export default async function OwnPasswordPage() {
  const { user } = await loadSite();
  return (
    <>
      <h1>{user.mustChangePassword ? "Choose your own password" : "Change your password"}</h1>
      {user.mustChangePassword ? (
        <p className="lede">
          The password you signed in with was set by an administrator and is for the first sign-in only. Choose one that
          only you know; the rest of the application opens once it is saved.
        </p>
      ) : (
        <p className="lede">Type your current password, then the new one twice.</p>
      )}
      <ActionForm action={changeOwnPasswordAction} submitLabel="Save my password" label="Your password">
        <Field
          name="current"
          label={user.mustChangePassword ? "Password you were given" : "Current password"}
          type="password"
          autoComplete="current-password"
          maxLength={MAX_PASSWORD_LENGTH}
        />
        <Field
          name="password"
          label="New password"
          type="password"
          autoComplete="new-password"
          maxLength={MAX_PASSWORD_LENGTH}
          hint={`At least ${MIN_PASSWORD_LENGTH} characters; a few unrelated words are easy to remember and hard to guess.`}
        />
        <Field
          name="confirm"
          label="New password again"
          type="password"
          autoComplete="new-password"
          maxLength={MAX_PASSWORD_LENGTH}
        />
      </ActionForm>
    </>
  );
}
