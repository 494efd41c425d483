import type { Db } from "@/lib/core/connect";
import type { SiteRole } from "@/lib/core/vocabulary";
import type { LotDetail } from "@/lib/feedstock/lot-detail.store";
import { DEFAULT_DENSITY_TABLE, getDensityEntry, requireDensityEntry } from "@/lib/quantity/density";
import type { MaterialKind } from "@/lib/quantity/density";
import { num } from "@/app/_ui/format";
import { MoveSection } from "@/app/tanks/move-section";

/** A feedstock lot into a feedstock tank, converting a volume with the lot's own density. */
export function MoveLotSection({
  db,
  site,
  user,
  lot,
}: {
  db: Db;
  site: { id: number; timeZone: string };
  user: { now: Date; role: SiteRole };
  lot: LotDetail;
}) {
  const entry =
    getDensityEntry(DEFAULT_DENSITY_TABLE, lot.material as MaterialKind) ??
    requireDensityEntry(DEFAULT_DENSITY_TABLE, "OTHER_OIL");
  const slope =
    entry.model === "linear"
      ? ` and about ${num(Math.abs(entry.slopeKgM3PerK), 2)} kg/m³ less per °C warmer (density table)`
      : "";
  const basis = `Uses this lot's density, ${num(lot.densityKgM3, 1)} kg/m³ at ${num(lot.referenceTempC, 0)} °C${slope}.`;
  const blocked =
    lot.status === "QUARANTINED"
      ? "A lot awaiting the lab cannot go into a tank yet: record its FFA and accept it first."
      : lot.status === "REJECTED"
        ? "A rejected lot cannot go into a tank."
        : lot.status === "CONSUMED"
          ? "This lot is used up."
          : undefined;
  return (
    <MoveSection
      db={db}
      siteId={site.id}
      timeZone={site.timeZone}
      now={user.now}
      role={user.role}
      from={{ kind: "LOT", code: lot.code, service: "FEEDSTOCK", stockG: lot.stockG }}
      {...(blocked ? { blocked } : {})}
      density={{ entry, densityKgM3: lot.densityKgM3, referenceTempC: lot.referenceTempC, basis }}
      title="Move into a tank"
    />
  );
}
