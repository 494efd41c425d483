"use client";
// The phone's outbox as seen by the page: opens IndexedDB, keeps the offline copy registered, and sends on
// start, when the network returns, when the page becomes visible and on a timer. Tabs share the outbox.
import { useCallback, useEffect, useRef, useState } from "react";
import type { OutboxEntry } from "@/lib/collect/outbox";
import { SEND_EVERY_MS } from "@/lib/collect/outbox";
import { flushOutbox, openOutbox } from "@/lib/collect/outbox-idb";
import type { Outbox } from "@/lib/collect/outbox-idb";
import { onSignOutSubmit, SHELL_PATH } from "@/app/collect/shell";

export interface SentNow {
  code: string;
  recordId: number;
  sourceCode: string;
  observedAt: string;
  receivedAt: string | null;
}

async function sendEntry(e: OutboxEntry): Promise<{ status: number; body: unknown }> {
  const res = await fetch("/api/pickups", {
    method: "POST",
    headers: { "content-type": "application/json", "idempotency-key": e.key },
    body: JSON.stringify(e.pickup),
    credentials: "same-origin",
    cache: "no-store",
  });
  let body: unknown = null;
  try {
    body = await res.json();
  } catch {
    body = null;
  }
  return { status: res.status, body };
}

/** Resolves once a worker is active: it has finished keeping the offline copy while installing. */
function whenActive(reg: ServiceWorkerRegistration): Promise<void> {
  return new Promise((resolve) => {
    const worker = reg.installing ?? reg.waiting;
    if (!worker) return resolve();
    worker.addEventListener("statechange", () => worker.state === "activated" && resolve());
  });
}

export function useOutbox(userId: number, builtAt: string) {
  const [entries, setEntries] = useState<OutboxEntry[]>([]);
  const [sentNow, setSentNow] = useState<SentNow[]>([]);
  const [online, setOnline] = useState(true);
  const [offlineReady, setOfflineReady] = useState(false);
  const [storagePersisted, setStoragePersisted] = useState<boolean | null>(null);
  const [needSignIn, setNeedSignIn] = useState<string | null>(null);
  const [lastProblem, setLastProblem] = useState<string | null>(null);
  const [boxReady, setBoxReady] = useState(false);
  const [sending, setSending] = useState(false);
  const [now, setNow] = useState(() => new Date(builtAt));

  const boxRef = useRef<Outbox | null>(null);
  const channel = useRef<BroadcastChannel | null>(null);
  const entriesRef = useRef<OutboxEntry[]>([]);
  const userRef = useRef(userId);
  const flushing = useRef(false);
  const again = useRef(false);
  userRef.current = userId;
  entriesRef.current = entries;

  const refresh = useCallback(async () => {
    const box = boxRef.current;
    if (box) setEntries(await box.all());
  }, []);

  /** Other tabs on this phone share the outbox: tell them to re-read it. */
  const announce = useCallback(() => {
    try {
      channel.current?.postMessage("outbox-changed");
    } catch {
      /* a closed channel: the other tabs re-read on their timer */
    }
  }, []);

  /** Sends what is waiting; `asUser` right after a new sign-in, before the page has re-rendered. */
  const flush = useCallback(
    async (asUser?: number): Promise<void> => {
      const box = boxRef.current;
      if (!box) return;
      if (flushing.current) {
        // A trigger (the network came back, a new entry) during a send: go round once more afterwards.
        again.current = true;
        return;
      }
      flushing.current = true;
      again.current = false;
      setSending(true);
      try {
        const uid = asUser ?? userRef.current;
        const run = () => flushOutbox(box, uid, sendEntry, () => new Date());
        // One sender at a time across tabs; without Web Locks the idempotency key still makes a twin harmless.
        const report = navigator.locks ? await navigator.locks.request("tracevat-collect-outbox", run) : await run();
        if (report.stored.length)
          setSentNow((prev) => [
            ...report.stored
              .map((s) => ({
                code: s.code,
                recordId: s.recordId,
                sourceCode: s.sourceCode,
                observedAt: s.observedAt,
                receivedAt: s.receivedAt,
              }))
              .reverse(),
            ...prev,
          ]);
        setNeedSignIn(report.signIn);
        setLastProblem(report.offline);
      } finally {
        flushing.current = false;
        setSending(false);
        await refresh();
        announce();
      }
      if (again.current) await flush(asUser);
    },
    [refresh, announce],
  );

  useEffect(() => {
    let stop = false;
    setOnline(navigator.onLine);
    setNow(new Date());
    if (typeof BroadcastChannel !== "undefined") {
      channel.current = new BroadcastChannel("tracevat-collect-outbox");
      channel.current.onmessage = () => void refresh();
    }
    void openOutbox().then(async (box) => {
      if (stop) return box.close();
      boxRef.current = box;
      setBoxReady(true);
      await refresh();
      await flush();
    });
    const fromWorker = (ev: MessageEvent<{ type?: string }>) => ev.data?.type === "send-outbox" && void flush();
    if ("serviceWorker" in navigator) {
      navigator.serviceWorker
        .register("/collect/sw.js", { scope: SHELL_PATH })
        .then(whenActive)
        .then(() => !stop && setOfflineReady(true))
        .catch(() => setOfflineReady(false));
      navigator.serviceWorker.addEventListener("message", fromWorker);
    }
    void navigator.storage
      ?.persist?.()
      .then((p) => !stop && setStoragePersisted(p))
      .catch(() => undefined);
    const goOnline = () => {
      setOnline(true);
      void flush();
    };
    const goOffline = () => setOnline(false);
    const visible = () => document.visibilityState === "visible" && void flush();
    window.addEventListener("online", goOnline);
    window.addEventListener("offline", goOffline);
    document.addEventListener("visibilitychange", visible);
    const timer = window.setInterval(() => {
      setNow(new Date());
      void refresh().then(() => flush());
    }, SEND_EVERY_MS);
    return () => {
      stop = true;
      window.removeEventListener("online", goOnline);
      window.removeEventListener("offline", goOffline);
      document.removeEventListener("visibilitychange", visible);
      if ("serviceWorker" in navigator) navigator.serviceWorker.removeEventListener("message", fromWorker);
      window.clearInterval(timer);
      channel.current?.close();
      boxRef.current?.close();
      boxRef.current = null;
    };
  }, [flush, refresh]);

  // Signing out (the header's button) with entries still waiting asks first.
  useEffect(() => {
    // The offline copy of the page shows this site's sources and history: not kept after signing out.
    const onSubmit = onSignOutSubmit(() => entriesRef.current);
    window.addEventListener("submit", onSubmit, true);
    return () => window.removeEventListener("submit", onSubmit, true);
  }, []);

  return {
    box: boxRef,
    entries,
    sentNow,
    online,
    offlineReady,
    storagePersisted,
    needSignIn,
    setNeedSignIn,
    lastProblem,
    boxReady,
    sending,
    now,
    flush,
    refresh,
    announce,
  };
}
