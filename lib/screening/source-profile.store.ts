import "server-only";
import type { Db, Tx } from "@/lib/core/connect";
import type { SourceProfile } from "@/lib/screening/screening.schema";

export interface SourceProfileRow {
  id: number;
  kind: string;
  capacityBasis: string | null;
  fryers: number | null;
  fryerLitres: number | null;
  changesPerWeek: number | null;
  declaredLitresPerMonth: number | null;
  capacityDeclaredAt: Date | null;
  capacityDeclaredBy: string | null;
  pickupEveryDays: number | null;
  latitude: number | null;
  longitude: number | null;
  opensHour: number | null;
  closesHour: number | null;
  onWatch: boolean;
  creditWithheld: boolean;
}

const SELECT = {
  id: true,
  kind: true,
  capacityBasis: true,
  fryers: true,
  fryerLitres: true,
  changesPerWeek: true,
  declaredLitresPerMonth: true,
  capacityDeclaredAt: true,
  capacityDeclaredBy: true,
  pickupEveryDays: true,
  latitude: true,
  longitude: true,
  opensHour: true,
  closesHour: true,
  onWatch: true,
  creditWithheld: true,
} as const;

export async function getSourceProfile(tx: Tx | Db, siteId: number, code: string): Promise<SourceProfileRow | null> {
  return tx.source.findUnique({ where: { siteId_code: { siteId, code } }, select: SELECT });
}

export async function updateSourceProfile(tx: Tx, id: number, p: SourceProfile): Promise<void> {
  const fryers = p.capacityBasis === "FRYERS";
  await tx.source.update({
    where: { id },
    data: {
      kind: p.kind,
      capacityBasis: p.capacityBasis ?? null,
      fryers: fryers ? (p.fryers ?? null) : null,
      fryerLitres: fryers ? (p.fryerLitres ?? null) : null,
      changesPerWeek: fryers ? (p.changesPerWeek ?? null) : null,
      declaredLitresPerMonth: p.capacityBasis === "MONTHLY" ? (p.declaredLitresPerMonth ?? null) : null,
      capacityDeclaredAt: p.capacityBasis === undefined ? null : (p.capacityDeclaredAt ?? null),
      capacityDeclaredBy: p.capacityBasis === undefined ? null : (p.capacityDeclaredBy ?? null),
      pickupEveryDays: p.pickupEveryDays ?? null,
      latitude: p.latitude ?? null,
      longitude: p.longitude ?? null,
      opensHour: p.opensHour ?? null,
      closesHour: p.closesHour ?? null,
    },
  });
}
