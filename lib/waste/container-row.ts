// A waste container as the lists and pages show it, mapped once from its stored record.
export interface WasteContainerRow {
  code: string;
  stream: string;
  location: string;
  accumulationStart: Date;
  capacityMl: number;
  satellite: boolean;
  methanolPct: number | null;
  pH: number | null;
  flashPointC: number | null;
  waterPct: number | null;
  status: string;
  stockG: number;
  fullAt: Date | null;
  characterisedAt: Date | null;
}

export type ContainerRecord = {
  code: string;
  stream: string;
  location: string;
  accumulationStart: Date;
  capacityMl: number;
  satellite: boolean;
  methanolPct: number | null;
  pH: number | null;
  flashPointC: number | null;
  waterPct: number | null;
  status: string;
  fullAt: Date | null;
  characterisedAt: Date | null;
  holder: { stockG: number };
};

export function toContainerRow(r: ContainerRecord): WasteContainerRow {
  return {
    code: r.code,
    stream: r.stream,
    location: r.location,
    accumulationStart: r.accumulationStart,
    capacityMl: r.capacityMl,
    satellite: r.satellite,
    methanolPct: r.methanolPct,
    pH: r.pH,
    flashPointC: r.flashPointC,
    waterPct: r.waterPct,
    status: r.status,
    stockG: r.holder.stockG,
    fullAt: r.fullAt,
    characterisedAt: r.characterisedAt,
  };
}
