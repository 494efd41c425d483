"use client";
import { useActionState } from "react";
import { signInAction } from "@/app/login/actions";
import type { SignInState } from "@/app/login/actions";

export function SignInForm({ next }: { next: string }) {
  const [state, action, pending] = useActionState<SignInState, FormData>(signInAction, {
    login: "",
    message: null,
    field: null,
  });
  return (
    <form action={action} className="sign-in" noValidate>
      <input type="hidden" name="next" value={next} />
      <label>
        User name
        <input
          name="login"
          autoComplete="username"
          defaultValue={state.login}
          required
          aria-invalid={state.field === "login" || undefined}
        />
      </label>
      <label>
        Password
        <input
          name="password"
          type="password"
          autoComplete="current-password"
          required
          aria-invalid={state.field === "password" || undefined}
        />
      </label>
      {state.message ? (
        <p className="form-error" role="alert">
          {state.message}
        </p>
      ) : null}
      <button type="submit" disabled={pending}>
        {pending ? "Signing in…" : "Sign in"}
      </button>
    </form>
  );
}
