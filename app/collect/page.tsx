import type { Metadata, Viewport } from "next";
import { routeDue } from "@/lib/collect/route";
import { listCollectSources, listReceivedFromCollector, listRecentPickupsBySource } from "@/lib/collect/collect.store";
import type { HistoryPickup } from "@/lib/collect/collect.store";
import { day } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { NoSite } from "@/app/_ui/ui";
import { CollectApp } from "@/app/collect/collect-app";
import type { PhoneData, PhoneHistory } from "@/app/collect/types";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Collect" };
export const viewport: Viewport = { width: "device-width", initialScale: 1 };

const HISTORY_DAYS = 120;
const HISTORY_PER_SOURCE = 5;

function toPhone(h: HistoryPickup): PhoneHistory {
  return {
    code: h.code,
    observedAt: h.observedAt.toISOString(),
    receivedAt: h.receivedAt.toISOString(),
    containers: h.containers,
    volumeMl: h.volumeMl,
    tempC: h.tempC,
    waterLook: h.waterLook,
    solidsLook: h.solidsLook,
    collector: h.collector,
  };
}

export default async function CollectPage() {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const now = user.now;
  const tz = site.timeZone;
  const today = day(now, tz);
  const [sources, history, received] = await Promise.all([
    listCollectSources(db, site.id),
    listRecentPickupsBySource(db, site.id, new Date(now.getTime() - HISTORY_DAYS * 86_400_000), HISTORY_PER_SOURCE),
    listReceivedFromCollector(db, site.id, user.userId, new Date(now.getTime() - 2 * 86_400_000)),
  ]);
  const route = routeDue(
    sources.map((s) => ({
      code: s.code,
      name: s.name,
      active: true,
      pickupEveryDays: s.pickupEveryDays,
      lastPickupDay: s.lastPickupAt ? day(s.lastPickupAt, tz) : null,
    })),
    today,
  );
  const data: PhoneData = {
    user: {
      userId: user.userId,
      login: user.login,
      fullName: user.fullName,
      unitSystem: user.unitSystem,
      mayRecord: user.role === "COLLECTOR" || user.role === "PRODUCTION",
    },
    timeZone: tz,
    today,
    builtAt: now.toISOString(),
    sources: sources.map((s) => ({
      code: s.code,
      name: s.name,
      address: s.address,
      materials: s.materials,
      pickupEveryDays: s.pickupEveryDays,
      collectorNote: s.collectorNote,
      lastPickupAt: s.lastPickupAt?.toISOString() ?? null,
      position: s.latitude === null || s.longitude === null ? null : { lat: s.latitude, lon: s.longitude },
      history: (history.get(s.code) ?? []).map(toPhone),
    })),
    route: route.map((r) => ({ code: r.code, dueDay: r.dueDay, daysOverdue: r.daysOverdue })),
    received: received.map((h) => ({ ...toPhone(h), sourceCode: h.sourceCode })),
  };
  return <CollectApp data={data} />;
}
