"use client";
import { useEffect } from "react";
import { usePathname } from "next/navigation";
import type { OutboxEntry } from "@/lib/collect/outbox";
import { openOutbox } from "@/lib/collect/outbox-idb";
import { onSignOutSubmit } from "@/app/collect/shell";

/**
 * On every page but the collect page (which has its own live count): signing out while pickups still
 * wait in this browser's outbox asks first. The count is read on load, on focus and every 15 s, so the
 * submit handler can decide at once.
 */
export function SignOutGuard() {
  const path = usePathname();
  useEffect(() => {
    if (path.startsWith("/collect") || typeof indexedDB === "undefined") return;
    let waiting: OutboxEntry[] = [];
    let stopped = false;
    const read = async () => {
      try {
        const box = await openOutbox();
        const all = await box.all();
        box.close();
        if (!stopped) waiting = all;
      } catch {
        // No outbox in this browser (or storage blocked): nothing can be waiting.
      }
    };
    void read();
    const timer = window.setInterval(() => void read(), 15_000);
    const onFocus = () => void read();
    const onSubmit = onSignOutSubmit(() => waiting);
    window.addEventListener("focus", onFocus);
    window.addEventListener("submit", onSubmit, true);
    return () => {
      stopped = true;
      window.clearInterval(timer);
      window.removeEventListener("focus", onFocus);
      window.removeEventListener("submit", onSubmit, true);
    };
  }, [path]);
  return null;
}
