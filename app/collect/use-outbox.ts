"use client";
// The phone's outbox as seen by the page: opens IndexedDB, keeps the offline copy registered, and sends on
// start, when the network returns, when the page becomes visible and on a timer. Tabs share the outbox.
import { useCallback, useEffect, useRef, useState } from "react";
import type { RefObject } from "react";
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

type Stored = Awaited<ReturnType<typeof flushOutbox>>["stored"];

/** What the server stored in one send, newest first, as the page lists it. */
function sentNowOf(stored: Stored): SentNow[] {
  return stored
    .map((s) => ({
      code: s.code,
      recordId: s.recordId,
      sourceCode: s.sourceCode,
      observedAt: s.observedAt,
      receivedAt: s.receivedAt,
    }))
    .reverse();
}

/** The offline copy of the page (a service worker, which may also ask to send) and storage the browser keeps. */
function useOfflineCopy(flush: () => Promise<void>) {
  const [offlineReady, setOfflineReady] = useState(false);
  const [storagePersisted, setStoragePersisted] = useState<boolean | null>(null);
  useEffect(() => {
    let stop = false;
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
    return () => {
      stop = true;
      if ("serviceWorker" in navigator) navigator.serviceWorker.removeEventListener("message", fromWorker);
    };
  }, [flush]);
  return { offlineReady, storagePersisted };
}

/** Sends when the network returns, when the page is shown again and on a timer; keeps the time the page shows. */
function useSendTriggers(flush: () => Promise<void>, refresh: () => Promise<void>, builtAt: string) {
  const [online, setOnline] = useState(true);
  const [now, setNow] = useState(() => new Date(builtAt));
  useEffect(() => {
    setOnline(navigator.onLine);
    setNow(new Date());
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
      window.removeEventListener("online", goOnline);
      window.removeEventListener("offline", goOffline);
      document.removeEventListener("visibilitychange", visible);
      window.clearInterval(timer);
    };
  }, [flush, refresh]);
  return { online, now };
}

/** Sends what is waiting, one send at a time; what was stored, and what stopped the last send. */
function useSender(
  boxRef: RefObject<Outbox | null>,
  userRef: RefObject<number>,
  refresh: () => Promise<void>,
  announce: () => void,
) {
  const [sentNow, setSentNow] = useState<SentNow[]>([]);
  const [needSignIn, setNeedSignIn] = useState<string | null>(null);
  const [lastProblem, setLastProblem] = useState<string | null>(null);
  const [sending, setSending] = useState(false);
  const flushing = useRef(false);
  const again = useRef(false);

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
        if (report.stored.length) setSentNow((prev) => [...sentNowOf(report.stored), ...prev]);
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
    [boxRef, userRef, refresh, announce],
  );
  return { flush, sentNow, needSignIn, setNeedSignIn, lastProblem, sending };
}

/** Signing out (the header's button) with entries still waiting asks first. */
function useSignOutGuard(entriesRef: RefObject<OutboxEntry[]>) {
  useEffect(() => {
    // The offline copy of the page shows this site's sources and history: not kept after signing out.
    const onSubmit = onSignOutSubmit(() => entriesRef.current);
    window.addEventListener("submit", onSubmit, true);
    return () => window.removeEventListener("submit", onSubmit, true);
  }, [entriesRef]);
}

export function useOutbox(userId: number, builtAt: string) {
  const [entries, setEntries] = useState<OutboxEntry[]>([]);
  const [boxReady, setBoxReady] = useState(false);

  const boxRef = useRef<Outbox | null>(null);
  const channel = useRef<BroadcastChannel | null>(null);
  const entriesRef = useRef<OutboxEntry[]>([]);
  const userRef = useRef(userId);
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

  const sender = useSender(boxRef, userRef, refresh, announce);
  const { flush } = sender;

  useEffect(() => {
    let stop = false;
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
    return () => {
      stop = true;
      channel.current?.close();
      boxRef.current?.close();
      boxRef.current = null;
    };
  }, [flush, refresh]);
  const { offlineReady, storagePersisted } = useOfflineCopy(flush);
  const { online, now } = useSendTriggers(flush, refresh, builtAt);

  useSignOutGuard(entriesRef);

  return {
    box: boxRef,
    entries,
    sentNow: sender.sentNow,
    online,
    offlineReady,
    storagePersisted,
    needSignIn: sender.needSignIn,
    setNeedSignIn: sender.setNeedSignIn,
    lastProblem: sender.lastProblem,
    boxReady,
    sending: sender.sending,
    now,
    flush,
    refresh,
    announce,
  };
}
