// A minimal plant for integration tests: one site, one person per role, a source and the tanks.
import type { Db } from "@/lib/core/connect";
import type { Actor } from "@/lib/core/actor";
import { insertSite, insertUser } from "@/lib/site/site.store";
import { insertSource } from "@/lib/source/source.store";
import { SourceSchema } from "@/lib/source/source.schema";
import { runInTransaction } from "@/lib/ledger/transaction.store";
import { createTank } from "@/lib/tank/tank.service";

export interface TestPlant {
  siteId: number;
  collector: Actor;
  production: Actor;
  compliance: Actor;
}

export function at(iso: string): Date {
  return new Date(iso);
}

export async function createTestPlant(db: Db): Promise<TestPlant> {
  const site = await insertSite(db, { code: "TST", name: "Test Works", town: "Testford", timeZone: "UTC" });
  const actor = async (login: string, role: "COLLECTOR" | "PRODUCTION" | "COMPLIANCE"): Promise<Actor> => ({
    siteId: site.id,
    userId: (await insertUser(db, { siteId: site.id, login, fullName: login, role })).id,
    now: at("2026-03-01T12:00:00Z"),
  });
  const plant = {
    siteId: site.id,
    collector: await actor("c", "COLLECTOR"),
    production: await actor("p", "PRODUCTION"),
    compliance: await actor("q", "COMPLIANCE"),
  };
  const src = await runInTransaction(db, (tx) =>
    insertSource(
      tx,
      site.id,
      SourceSchema.parse({ code: "R1", name: "Test Kitchen", kind: "RESTAURANT", materials: ["USED_COOKING_OIL"] }),
    ),
  );
  if (!src.ok) throw new Error("source");
  for (const t of [
    { code: "T1", name: "Feed", service: "FEEDSTOCK", capacityL: 50_000 },
    { code: "P1", name: "Product", service: "PRODUCT", capacityL: 50_000 },
    { code: "M1", name: "Methanol", service: "METHANOL", capacityL: 10_000 },
  ]) {
    const r = await createTank(db, plant.production, t);
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
  }
  return plant;
}

/** A pickup received whole into a lot, titrated and accepted, so it can be drawn into tanks and batches. */
export async function acceptedLot(
  db: Db,
  plant: TestPlant,
  o: { lot: string; pickup: string; day: number; volumeL?: number },
): Promise<void> {
  const { recordPickup } = await import("@/lib/feedstock/pickup.service");
  const { decideLot, receiveLotFromPickups } = await import("@/lib/feedstock/lot.service");
  const { recordTitration } = await import("@/lib/feedstock/titration.service");
  const dd = String(o.day).padStart(2, "0");
  const volumeL = o.volumeL ?? 300;
  const must = <T>(r: { ok: true; value: T } | { ok: false; issues: unknown }): T => {
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    return r.value;
  };
  must(
    await recordPickup(db, plant.collector, {
      code: o.pickup,
      sourceCode: "R1",
      material: "USED_COOKING_OIL",
      observedAt: `2026-02-${dd}T09:00:00Z`,
      containers: 5,
      volumeL,
      tempC: 15,
    }),
  );
  must(
    await receiveLotFromPickups(db, plant.production, {
      code: o.lot,
      material: "USED_COOKING_OIL",
      receivedAt: `2026-02-${dd}T16:00:00Z`,
      observedVolumeL: volumeL,
      observedTempC: 15,
      pickupCodes: [o.pickup],
    }),
  );
  must(
    await recordTitration(db, plant.production, {
      lotCode: o.lot,
      testedAt: `2026-02-${dd}T17:00:00Z`,
      sampleMassG: 7.05,
      titrant: "NAOH",
      concentrationMolL: 0.25,
      titreMl: 2,
      basis: "OLEIC",
    }),
  );
  must(await decideLot(db, plant.production, { lotCode: o.lot, status: "ACCEPTED" }));
}
