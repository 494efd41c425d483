"use client";
// The top of the collect page: connection and outbox state, and signing in again when a session ended.
import { useState } from "react";
import type { FormEvent } from "react";
import type { UnitSystem } from "@/lib/quantity/units";
import type { PhoneData } from "@/app/collect/types";

export function StatusBar({
  online,
  waiting,
  sending,
  onSend,
}: {
  online: boolean;
  waiting: number;
  sending: boolean;
  onSend: () => void;
}) {
  return (
    <div className="collect-bar" role="status" aria-live="polite">
      <span className={online ? "collect-net on" : "collect-net off"}>{online ? "Online" : "No connection"}</span>
      <span className="collect-count" data-waiting={waiting}>
        {waiting === 0 ? "All sent" : `${waiting} waiting`}
      </span>
      <button type="button" className="collect-send" onClick={onSend} disabled={sending || waiting === 0}>
        {sending ? "Sending…" : "Send now"}
      </button>
    </div>
  );
}

type PhoneUser = PhoneData["user"];
interface SessionAnswer {
  ok: boolean;
  value?: { user: { userId: number; login: string; fullName: string; role: string; unitSystem: UnitSystem } };
  issues?: Array<{ message: string }>;
}

interface SignInAgainProps {
  why: string;
  waiting: number;
  login: string;
  /** Called with the account that signed in; the caller sends what waits. */
  onSignedIn: (u: PhoneUser) => Promise<void>;
}

export function SignInAgain({ why, waiting, login, onSignedIn }: SignInAgainProps) {
  const [message, setMessage] = useState<string | null>(null);
  async function signInAgain(ev: FormEvent<HTMLFormElement>) {
    ev.preventDefault();
    const form = new FormData(ev.currentTarget);
    setMessage(null);
    try {
      const res = await fetch("/api/session", {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify({ login: form.get("login"), password: form.get("password") }),
      });
      const body = (await res.json()) as SessionAnswer;
      if (!body.ok || !body.value) return setMessage(body.issues?.[0]?.message ?? "Sign-in failed");
      const u = body.value.user;
      await onSignedIn({
        userId: u.userId,
        login: u.login,
        fullName: u.fullName,
        unitSystem: u.unitSystem,
        mayRecord: u.role === "COLLECTOR" || u.role === "PRODUCTION",
      });
    } catch {
      setMessage("No connection: signing in needs the network. Your entries stay on this phone.");
    }
  }
  return (
    <section className="collect-signin" aria-labelledby="signin-h">
      <h2 id="signin-h">Sign in again to send</h2>
      <p>
        {why}. {waiting} pickup{waiting === 1 ? "" : "s"} stay on this phone until then; nothing is lost.
      </p>
      <form onSubmit={(e) => void signInAgain(e)}>
        <label>
          User name
          <input name="login" autoComplete="username" defaultValue={login} required />
        </label>
        <label>
          Password
          <input name="password" type="password" autoComplete="current-password" required />
        </label>
        {message ? (
          <p className="form-error" role="alert">
            {message}
          </p>
        ) : null}
        <button type="submit" className="collect-primary">
          Sign in and send
        </button>
      </form>
    </section>
  );
}
