// Shared by the service worker's route and the page.
import type { OutboxEntry } from "@/lib/collect/outbox";
import { signOutWarning } from "@/lib/collect/outbox";
/** Bump when the worker's caching rules change; older caches are deleted on activation. */
export const SHELL_CACHE = "tracevat-collect-shell-v1";
export const SHELL_PATH = "/collect";

/**
 * A capture-phase submit listener for the header's sign-out form: with entries still waiting it asks
 * first (and cancels on "no"); signing out drops the offline copy of the signed-in page.
 */
export function onSignOutSubmit(waiting: () => readonly OutboxEntry[]) {
  return (ev: SubmitEvent) => {
    const form = ev.target;
    if (!(form instanceof HTMLFormElement) || !form.classList.contains("who")) return;
    const text = signOutWarning(waiting());
    if (text && !window.confirm(text)) {
      ev.preventDefault();
      ev.stopImmediatePropagation();
      return;
    }
    if (typeof caches !== "undefined") void caches.delete(SHELL_CACHE).catch(() => undefined);
  };
}
