// The collector page's service worker, served by a route handler (the app has no public/ folder).
// It keeps an offline copy of the page and its static files; the outbox itself lives in IndexedDB and
// is sent by the page (on start, when the network returns and on a timer), so nothing depends on the
// browser's background-sync event.

import { SHELL_CACHE as CACHE, SHELL_PATH as SHELL } from "@/app/collect/shell";

const NETWORK_TIMEOUT_MS = 6000;

export const dynamic = "force-static";

const SCRIPT = `
const CACHE = ${JSON.stringify(CACHE)};
const SHELL = ${JSON.stringify(SHELL)};
const NETWORK_TIMEOUT_MS = ${NETWORK_TIMEOUT_MS};

function staticUrls(html) {
  const found = new Set();
  const re = /\\/_next\\/static\\/[^"'\\s\\\\)<>]+/g;
  let m;
  while ((m = re.exec(html)) !== null) found.add(m[0]);
  found.add("/icon.svg");
  return [...found];
}

async function cacheShell() {
  const cache = await caches.open(CACHE);
  const res = await fetch(SHELL, { credentials: "same-origin", cache: "no-store" });
  if (!res.ok || res.redirected) return;
  await cache.put(SHELL, res.clone());
  const urls = staticUrls(await res.text());
  await Promise.all(urls.map(async (u) => {
    try {
      const r = await fetch(u, { credentials: "same-origin" });
      if (r.ok) await cache.put(u, r);
    } catch (e) { /* a missing file is fetched again at run time */ }
  }));
}

self.addEventListener("install", (event) => {
  event.waitUntil(cacheShell().catch(() => undefined).then(() => self.skipWaiting()));
});

self.addEventListener("activate", (event) => {
  event.waitUntil((async () => {
    for (const name of await caches.keys()) if (name !== CACHE) await caches.delete(name);
    await self.clients.claim();
  })());
});

function withTimeout(promise, ms) {
  return new Promise((resolve, reject) => {
    const t = setTimeout(() => reject(new Error("network timeout")), ms);
    promise.then((v) => { clearTimeout(t); resolve(v); }, (e) => { clearTimeout(t); reject(e); });
  });
}

async function offlineCopy() {
  const cache = await caches.open(CACHE);
  const hit = await cache.match(SHELL);
  if (!hit) return Response.error();
  // Same body and headers (the CSP nonce in them matches the nonce in the page), plus a marker.
  const headers = new Headers(hit.headers);
  headers.set("x-tracevat-offline-copy", "1");
  return new Response(await hit.blob(), { status: 200, statusText: "OK", headers });
}

async function page(request) {
  try {
    const res = await withTimeout(fetch(request), NETWORK_TIMEOUT_MS);
    const cache = await caches.open(CACHE);
    if (res.ok && res.type === "basic" && !res.redirected) await cache.put(SHELL, res.clone());
    // Sent to sign-in: the session is gone, so the copy of the signed-in page is dropped too.
    else if (res.type === "opaqueredirect" || res.redirected || res.status === 401) await cache.delete(SHELL);
    return res;
  } catch (e) {
    return offlineCopy();
  }
}

async function staticFile(request) {
  const cache = await caches.open(CACHE);
  const hit = await cache.match(request, { ignoreSearch: false });
  if (hit) return hit;
  const res = await fetch(request);
  if (res.ok) await cache.put(request, res.clone());
  return res;
}

self.addEventListener("fetch", (event) => {
  const request = event.request;
  if (request.method !== "GET") return;
  const url = new URL(request.url);
  if (url.origin !== self.location.origin) return;
  if (request.mode === "navigate" && url.pathname === SHELL) return event.respondWith(page(request));
  if (url.pathname.startsWith("/_next/static/") || url.pathname === "/icon.svg") return event.respondWith(staticFile(request));
});

// Where the browser has background sync, it only nudges open pages to send; the page does the sending.
self.addEventListener("sync", (event) => {
  event.waitUntil(self.clients.matchAll({ type: "window" }).then((list) => list.forEach((c) => c.postMessage({ type: "send-outbox" }))));
});
`;

export function GET(): Response {
  return new Response(SCRIPT, {
    headers: {
      "content-type": "text/javascript; charset=utf-8",
      "cache-control": "no-cache",
      // The page is /collect (no trailing slash), which lies above this script's default scope /collect/.
      "service-worker-allowed": SHELL,
    },
  });
}
