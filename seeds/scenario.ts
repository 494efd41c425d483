// The demo plant's six months, generated as an ordered list of operations (plain inputs for the
// services, parsed by the same schemas). Deterministic: the same anchor day gives the same plant.
// The simulation keeps its own book of stocks so that every draw it writes is one the ledger accepts.
import type { SourceInput } from "@/lib/source/source.schema";
import type { SourceProfileInput } from "@/lib/screening/screening.schema";
import {
  declaredProfile,
  FRESH_OIL_FFA,
  FRESH_OIL_SOURCE,
  HEAVY_WATER_PCT,
  TRIPLED_SOURCE,
  tripledMonth,
  WATER_SOURCE,
} from "@/seeds/screening-plant";
import type { PickupInput } from "@/lib/feedstock/pickup.schema";
import type { DeliveryLotInput, LabTestInput, LotFromPickupsInput } from "@/lib/feedstock/lot.schema";
import type { LotTitrationInput } from "@/lib/feedstock/titration.service";
import type { GaugeInput, TankInput, TransferInput } from "@/lib/tank/tank.schema";
import type { BatchCompleteInput, BatchPlanInput, BatchStartInput, ReagentLotInput } from "@/lib/batch/batch.schema";
import type { ProductDecisionInput, QcResultInput } from "@/lib/product/product.schema";
import type { ShipmentRecordInput } from "@/lib/shipment/shipment.schema";
import type { CustomerInput } from "@/lib/customer/customer.schema";
import { demoDecision, demoQcResults } from "@/seeds/qc";
import type { DisposalInput, WasteContainerInput } from "@/lib/waste/container.schema";
import type { AccountingPeriodInput } from "@/lib/period/period.schema";
import type { MaterialKind } from "@/lib/core/vocabulary";
import { measureObserved } from "@/lib/feedstock/measure";
import { DEFAULT_DENSITY_TABLE, densityAt, requireDensityEntry } from "@/lib/quantity/density";
import type { PEOPLE } from "@/seeds/names";
import {
  CRUSHERS,
  CUSTOMERS,
  DISPOSAL_FACILITIES,
  HAULERS,
  OTHER_SUPPLIERS,
  PROCESSORS,
  REAGENT_SUPPLIERS,
  RENDERERS,
  restaurantName,
  streetAddress,
} from "@/seeds/names";

export type Login = (typeof PEOPLE)[number]["login"];

export type Op =
  | { kind: "source"; at: Date; actor: Login; input: SourceInput }
  | { kind: "sourceProfile"; at: Date; actor: Login; input: SourceProfileInput }
  | { kind: "tank"; at: Date; actor: Login; input: TankInput }
  | { kind: "reagent"; at: Date; actor: Login; input: ReagentLotInput }
  | { kind: "pickup"; at: Date; actor: Login; input: PickupInput }
  | { kind: "lotFromPickups"; at: Date; actor: Login; input: LotFromPickupsInput }
  | { kind: "delivery"; at: Date; actor: Login; input: DeliveryLotInput }
  | { kind: "titration"; at: Date; actor: Login; input: LotTitrationInput }
  | { kind: "labTest"; at: Date; actor: Login; input: LabTestInput }
  | { kind: "decideLot"; at: Date; actor: Login; input: { lotCode: string; status: "ACCEPTED" | "REJECTED" } }
  | { kind: "transfer"; at: Date; actor: Login; input: TransferInput }
  | { kind: "gauge"; at: Date; actor: Login; input: GaugeInput }
  | { kind: "planBatch"; at: Date; actor: Login; input: BatchPlanInput }
  | { kind: "startBatch"; at: Date; actor: Login; input: BatchStartInput }
  | { kind: "completeBatch"; at: Date; actor: Login; input: BatchCompleteInput }
  | { kind: "qc"; at: Date; actor: Login; input: QcResultInput }
  | { kind: "decideProduct"; at: Date; actor: Login; input: ProductDecisionInput }
  | { kind: "customer"; at: Date; actor: Login; input: CustomerInput }
  | { kind: "ship"; at: Date; actor: Login; input: ShipmentRecordInput }
  | { kind: "wasteContainer"; at: Date; actor: Login; input: WasteContainerInput }
  | { kind: "disposal"; at: Date; actor: Login; input: DisposalInput }
  | { kind: "period"; at: Date; actor: Login; input: AccountingPeriodInput }
  | { kind: "closePeriod"; at: Date; actor: Login; input: { startsAt: Date } };

/** Small seeded generator (mulberry32) so the demo is the same on every machine. */
function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const DAY = 86_400_000;
/** Grams of a lot released in the demo's last days that stay in the lot for drum orders. */
const KEPT_BACK_G = 400_000;
/** Product lots of the last days still await their QC results (for the release screens to show). */
const QC_PENDING_DAYS = 10;
/** The one demo lot whose results fail its specification (the fifth lot tested). */
const FAILING_QC_LOT = 5;
/** The batch whose drain valve leaked: its unmeasured difference is above the site's closure tolerance. */
const LEAKY_BATCH = 6;
const r1 = (x: number) => Math.round(x * 10) / 10;
const r2 = (x: number) => Math.round(x * 100) / 100;
const r3 = (x: number) => Math.round(x * 1000) / 1000;

export interface ScenarioOptions {
  /** The scenario ends here (the demo's "today", 00:00 UTC). */
  anchor: Date;
  days?: number;
  seed?: number;
}

interface SimTank {
  code: string;
  stockG: number;
  capacityG: number;
  heelG: number;
  ffaMassG: number; // Σ FFA grams, for the blend's FFA (perfect mixing)
}

export function buildScenario(opts: ScenarioOptions): Op[] {
  const rand = rng(opts.seed ?? 20261202);
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rand() * xs.length)] as T;
  const between = (lo: number, hi: number) => lo + (hi - lo) * rand();
  const days = opts.days ?? 182;
  const anchor = Date.UTC(opts.anchor.getUTCFullYear(), opts.anchor.getUTCMonth(), opts.anchor.getUTCDate());
  const start = anchor - days * DAY;
  const t = (day: number, hour: number, minute = 0) => new Date(start + day * DAY + hour * 3_600_000 + minute * 60_000);
  const ops: Op[] = [];
  const at0 = t(0, 6);

  // ---- sources ------------------------------------------------------------------------------
  interface SimSource {
    code: string;
    material: MaterialKind;
    every: number;
    litres: number;
    nextDay: number;
    certified: boolean;
  }
  const collected: SimSource[] = [];
  for (let i = 0; i < 32; i++) {
    const trap = i % 8 === 5;
    const code = `R${String(i + 1).padStart(3, "0")}`;
    const certified = i % 3 !== 2;
    const every = 1 + (i % 4);
    collected.push({
      code,
      material: trap ? "TRAP_GREASE" : "USED_COOKING_OIL",
      every,
      litres: trap ? 380 : 90 + (i % 7) * 45,
      nextDay: i % every,
      certified,
    });
    ops.push({
      kind: "source",
      at: at0,
      actor: "admin.jory",
      input: {
        code,
        name: restaurantName(i),
        kind: "RESTAURANT",
        materials: [trap ? "TRAP_GREASE" : "USED_COOKING_OIL"],
        address: streetAddress(i),
        ...(certified
          ? {
              certificateNo: `SC-QM-${String(1000 + i)}`,
              certificateScheme: "Regional sustainable-waste scheme",
              certificateExpires: new Date(anchor + (40 + i * 9) * DAY),
            }
          : {}),
        pickupEveryDays: every,
        collectorNote: i % 6 === 0 ? "Drums behind the blue gate; ring the kitchen bell." : "",
      },
    });
  }
  PROCESSORS.forEach((name, i) => {
    const code = `F${String(i + 1).padStart(3, "0")}`;
    collected.push({
      code,
      material: "USED_COOKING_OIL",
      every: 7,
      litres: 1400 + i * 300,
      nextDay: 2 + i,
      certified: true,
    });
    ops.push({
      kind: "source",
      at: at0,
      actor: "admin.jory",
      input: {
        code,
        name,
        kind: "FOOD_PROCESSOR",
        materials: ["USED_COOKING_OIL"],
        address: streetAddress(40 + i),
        certificateNo: `SC-QM-${2000 + i}`,
        certificateScheme: "Regional sustainable-waste scheme",
        certificateExpires: new Date(anchor + 200 * DAY),
        pickupEveryDays: 7,
        collectorNote: "Tanker bay 2; weigh out at the gatehouse.",
      },
    });
  });
  const renderers = RENDERERS.map((name, i) => ({
    code: `D${String(i + 1).padStart(3, "0")}`,
    name,
    material: (i === 2 ? "TALLOW" : "YELLOW_GREASE") as MaterialKind,
  }));
  const crushers = CRUSHERS.map((name, i) => ({
    code: `C${String(i + 1).padStart(3, "0")}`,
    name,
    material: (i === 0 ? "SOYBEAN" : "CANOLA") as MaterialKind,
  }));
  for (const s of renderers)
    ops.push({
      kind: "source",
      at: at0,
      actor: "admin.jory",
      input: {
        code: s.code,
        name: s.name,
        kind: "RENDERER",
        materials: [s.material],
        address: "Rendering Lane, Otterholm Industrial Estate",
      },
    });
  for (const s of crushers)
    ops.push({
      kind: "source",
      at: at0,
      actor: "admin.jory",
      input: {
        code: s.code,
        name: s.name,
        kind: "CRUSHER",
        materials: [s.material],
        address: "Mill Wharf, Quillmoor",
        certificateNo: `SC-CR-${s.code}`,
        certificateScheme: "Regional crop-oil scheme",
        certificateExpires: new Date(anchor + 300 * DAY),
      },
    });
  ops.push({
    kind: "source",
    at: at0,
    actor: "admin.jory",
    input: {
      code: "O001",
      name: OTHER_SUPPLIERS[0] ?? "Civic depot",
      kind: "DROP_OFF",
      materials: ["USED_COOKING_OIL"],
      address: "Depot Road, Quillmoor",
      collectorNote: "Household oil drop-off bank; empty the 1 m³ bank.",
    },
  });
  collected.push({ code: "O001", material: "USED_COOKING_OIL", every: 14, litres: 600, nextDay: 5, certified: false });
  // Compliance's declared capacities and hours (source checks), and the month the planted restaurant triples.
  collected.forEach((s, i) =>
    ops.push({
      kind: "sourceProfile",
      at: at0,
      actor: "compliance.nell",
      input: declaredProfile(
        { ...s, kind: s.code.startsWith("R") ? "RESTAURANT" : s.code.startsWith("F") ? "FOOD_PROCESSOR" : "DROP_OFF" },
        i,
        at0,
      ),
    }),
  );
  const tripled = tripledMonth(anchor);
  const inTripledMonth = (day: number) => {
    const d = new Date(start + day * DAY);
    return d.getUTCFullYear() === tripled.year && d.getUTCMonth() === tripled.month;
  };
  const freshOilDay = days - 8;
  let waterLots = 0;
  let freshPlanted = false;

  // ---- tanks -------------------------------------------------------------------------------
  const tankDefs = [
    { code: "T1", name: "Used cooking oil tank", service: "FEEDSTOCK", capacityL: 90_000 },
    { code: "T2", name: "High-FFA feedstock tank", service: "FEEDSTOCK", capacityL: 60_000 },
    { code: "T3", name: "Seed oil and tallow tank", service: "FEEDSTOCK", capacityL: 60_000 },
    { code: "P1", name: "Finished fuel tank 1", service: "PRODUCT", capacityL: 120_000 },
    { code: "P2", name: "Finished fuel tank 2", service: "PRODUCT", capacityL: 120_000 },
    { code: "M1", name: "Recovered methanol tank", service: "METHANOL", capacityL: 20_000 },
  ] as const;
  // Fictional calibration tables for the two 60 m³ feedstock tanks: a coned bottom holding 900 L in its
  // lowest 200 mm, then 9.85 L per mm up to 6,200 mm. T1 has none on file (gauged by volume).
  const strapping60k = (): number[][] => [
    [0, 0],
    [200, 900],
    ...Array.from({ length: 12 }, (_, i) => [700 + i * 500, Math.round(900 + (500 + i * 500) * 9.85)]),
  ];
  for (const d of tankDefs)
    ops.push({
      kind: "tank",
      at: at0,
      actor: "admin.jory",
      input: { ...d, mixing: "MIXED", ...(d.code === "T2" || d.code === "T3" ? { strapping: strapping60k() } : {}) },
    });
  for (const c of CUSTOMERS) ops.push({ kind: "customer", at: at0, actor: "compliance.nell", input: { ...c } });
  const tanks = new Map<string, SimTank>();
  for (const d of tankDefs) {
    const material = d.service === "PRODUCT" ? "FAME" : d.service === "METHANOL" ? "METHANOL" : "USED_COOKING_OIL";
    const cap = Math.floor(d.capacityL * densityAt(requireDensityEntry(DEFAULT_DENSITY_TABLE, material), 15) * 0.97);
    tanks.set(d.code, { code: d.code, stockG: 0, capacityG: cap, heelG: Math.floor(cap * 0.08), ffaMassG: 0 });
  }
  const feedTankFor = (m: MaterialKind) =>
    m === "USED_COOKING_OIL" ? "T1" : m === "YELLOW_GREASE" || m === "TRAP_GREASE" ? "T2" : "T3";

  // ---- reagents ----------------------------------------------------------------------------
  const reagentLots: Array<{ code: string; reagent: "METHANOL" | "KOH" | "H2SO4" | "WATER"; stockG: number }> = [];
  let reagentSeq = 0;
  const receiveReagent = (
    reagent: "METHANOL" | "KOH" | "H2SO4" | "WATER",
    kg: number,
    at: Date,
    strengthPct: number,
  ) => {
    reagentSeq++;
    const code = `${reagent === "METHANOL" ? "MEOH" : reagent}-${String(reagentSeq).padStart(3, "0")}`;
    reagentLots.push({ code, reagent, stockG: Math.round(kg * 1000) });
    ops.push({
      kind: "reagent",
      at,
      actor: "production.tess",
      input: { code, reagent, supplier: REAGENT_SUPPLIERS[reagent], strengthPct, receivedAt: at, massKg: kg },
    });
  };
  const drawReagent = (
    reagent: "METHANOL" | "KOH" | "H2SO4" | "WATER",
    grams: number,
  ): Array<{ code: string; grams: number }> => {
    const out: Array<{ code: string; grams: number }> = [];
    let left = grams;
    for (const l of reagentLots) {
      if (l.reagent !== reagent || l.stockG <= 0 || left <= 0) continue;
      const take = Math.min(l.stockG, left);
      l.stockG -= take;
      left -= take;
      out.push({ code: l.code, grams: take });
    }
    if (left > 0) throw new Error(`scenario: ran out of ${reagent}`);
    return out;
  };
  const reagentStock = (reagent: string) =>
    reagentLots.filter((l) => l.reagent === reagent).reduce((s, l) => s + l.stockG, 0);

  // ---- waste containers ----------------------------------------------------------------------
  interface SimWaste {
    code: string;
    stream: "GLYCEROL_PHASE" | "WASH_WATER";
    stockG: number;
    capacityG: number;
    startedDay: number;
  }
  let wasteSeq = 0;
  const openContainer = (stream: SimWaste["stream"], day: number): SimWaste => {
    wasteSeq++;
    const code = `${stream === "GLYCEROL_PHASE" ? "GLY" : "WW"}-${String(wasteSeq).padStart(2, "0")}`;
    const capacityL = stream === "GLYCEROL_PHASE" ? 110_000 : 40_000;
    const glycerol = stream === "GLYCEROL_PHASE";
    ops.push({
      kind: "wasteContainer",
      at: t(day, 6, 30),
      actor: "compliance.nell",
      input: {
        code,
        stream,
        location: glycerol ? "Glycerol pad" : "Wash-water bay",
        accumulationStart: t(day, 6, 30),
        capacityL,
        satellite: false,
        // Typical characterisation ranges of crude glycerol and wash water (common practice, demo values).
        ...(glycerol
          ? {
              methanolPct: r1(between(8, 16)),
              pH: r1(between(9, 11.5)),
              flashPointC: r1(between(28, 48)),
              waterPct: r1(between(3, 9)),
            }
          : { methanolPct: r1(between(0.8, 3)), pH: r1(between(8, 10.5)), waterPct: r1(between(90, 96)) }),
      },
    });
    return {
      code,
      stream,
      stockG: 0,
      capacityG: Math.floor(capacityL * (glycerol ? 1.05 : 1.0) * 1000 * 0.95),
      startedDay: day,
    };
  };
  let glycerolBox = openContainer("GLYCEROL_PHASE", 0);
  let washBox = openContainer("WASH_WATER", 0);
  let disposalSeq = 0;
  const haul = (box: SimWaste, day: number) => {
    disposalSeq++;
    // The hauler comes at the end of the day, after that day's batch outputs.
    ops.push({
      kind: "disposal",
      at: t(day, 18),
      actor: "compliance.nell",
      input: {
        documentNo: `MAN-${String(disposalSeq).padStart(4, "0")}`,
        hauler: pick(HAULERS),
        disposedAt: t(day, 18),
        containerCode: box.code,
        massKg: box.stockG / 1000,
        destination: DISPOSAL_FACILITIES[box.stream],
      },
    });
    box.stockG = 0;
  };
  const glycerolHaulDays = [days - 180 + 40, days - 180 + 82, days - 84].filter((d) => d > 0 && d < days);

  // ---- product -------------------------------------------------------------------------------
  const productTanks = ["P1", "P2"];
  let shipmentSeq = 0;
  const heldProducts: Array<{ code: string; grams: number; readyDay: number }> = [];
  let qcSeq = 0;

  // ---- the days ------------------------------------------------------------------------------
  let lotSeq = 0;
  let pickupSeq = 0;
  let batchSeq = 0;
  const pendingLots: Array<{
    code: string;
    grams: number;
    material: MaterialKind;
    ffa: number;
    water: number;
    reject: boolean;
    day: number;
  }> = [];
  const stockLots: Array<{ code: string; grams: number; material: MaterialKind; ffa: number }> = [];
  receiveReagent("METHANOL", 18_000, t(0, 7), 99.9);
  receiveReagent("KOH", 1_500, t(0, 7), 90);
  receiveReagent("H2SO4", 600, t(0, 7), 96);
  receiveReagent("WATER", 60_000, t(0, 7), 100);

  const materialFfa = (m: MaterialKind) =>
    m === "USED_COOKING_OIL"
      ? between(0.8, 5.5)
      : m === "TRAP_GREASE"
        ? between(9, 15)
        : m === "YELLOW_GREASE"
          ? between(6, 14)
          : m === "TALLOW"
            ? between(1, 4)
            : between(0.5, 1.0);
  const materialWater = (m: MaterialKind) =>
    m === "TRAP_GREASE"
      ? between(0.8, 2.8)
      : m === "YELLOW_GREASE"
        ? between(0.3, 1.5)
        : m === "USED_COOKING_OIL"
          ? between(0.05, 1.2)
          : between(0.02, 0.1);
  const collectors: Login[] = ["collector.ivo", "collector.mira", "collector.odo"];

  for (let day = 0; day < days; day++) {
    const weekday = new Date(start + day * DAY).getUTCDay(); // 0 Sunday
    const isWorkday = weekday >= 1 && weekday <= 5;
    const seasonTemp = 24 - (14 * day) / days; // summer to winter

    // Lab: titrate yesterday's lots, decide, move accepted oil into its tank.
    for (const lot of pendingLots.filter((l) => l.day < day && day < days - 1)) {
      const at = t(day, 8, 30);
      const small = lot.ffa < 1;
      // AOCS Ca 5a-40 Table 1 sample sizes: titre in mL ≈ %FFA (7.05 g, 0.25 N) or 10 × %FFA (28.2 g, 0.1 N).
      for (const rep of [0, 1]) {
        const titre = r2((small ? lot.ffa * 10 : lot.ffa) * (1 + (rep ? 1 : -1) * between(0, 0.012)));
        ops.push({
          kind: "titration",
          at,
          actor: "production.rafe",
          input: {
            lotCode: lot.code,
            testedAt: new Date(at.getTime() + rep * 600_000),
            sampleMassG: small ? 28.2 : 7.05,
            titrant: "NAOH",
            concentrationMolL: small ? 0.1 : 0.25,
            titreMl: titre,
            blankMl: 0,
            basis: "OLEIC",
          },
        });
      }
      ops.push({
        kind: "labTest",
        at,
        actor: "production.rafe",
        input: {
          lotCode: lot.code,
          testedAt: at,
          kind: "WATER",
          method: "Karl Fischer (lab SOP W-2)",
          valuePct: r2(lot.water),
        },
      });
      ops.push({
        kind: "decideLot",
        at: t(day, 9),
        actor: "production.rafe",
        input: { lotCode: lot.code, status: lot.reject ? "REJECTED" : "ACCEPTED" },
      });
      pendingLots.splice(pendingLots.indexOf(lot), 1);
      if (!lot.reject) stockLots.push({ code: lot.code, grams: lot.grams, material: lot.material, ffa: lot.ffa });
    }
    for (const lot of [...stockLots]) {
      const tank = tanks.get(feedTankFor(lot.material));
      if (!tank || tank.stockG + lot.grams > tank.capacityG) continue; // waits in its drums/tote
      ops.push({
        kind: "transfer",
        at: t(day, 9, 30),
        actor: "production.tess",
        input: {
          fromKind: "LOT",
          fromCode: lot.code,
          toTankCode: tank.code,
          at: t(day, 9, 30),
          massKg: lot.grams / 1000,
          note: "",
        },
      });
      tank.stockG += lot.grams;
      tank.ffaMassG += (lot.grams * lot.ffa) / 100;
      stockLots.splice(stockLots.indexOf(lot), 1);
    }

    // Pickups along the routes (not on Sundays), pooled into one lot per material in the afternoon.
    if (weekday !== 0) {
      const todays: Array<{ code: string; material: MaterialKind; litres: number; source: string }> = [];
      for (const s of collected) {
        if (day < s.nextDay) continue;
        s.nextDay = day + s.every + (rand() < 0.15 ? 1 : 0);
        pickupSeq++;
        const code = `PU-${String(pickupSeq).padStart(5, "0")}`;
        const litres = r1(s.litres * between(0.6, 1.25) * (s.code === TRIPLED_SOURCE && inTripledMonth(day) ? 3 : 1));
        const containers = Math.max(1, Math.round(litres / (s.material === "TRAP_GREASE" ? 200 : 60)));
        const observed = t(day, 7 + Math.floor(rand() * 8), Math.floor(rand() * 60));
        ops.push({
          kind: "pickup",
          at: new Date(observed.getTime() + (rand() < 0.05 ? 5 * 3_600_000 : 20 * 60_000)),
          actor: pick(collectors),
          input: {
            code,
            sourceCode: s.code,
            material: s.material,
            observedAt: observed,
            containers,
            volumeL: litres,
            tempC: r1(seasonTemp + between(-3, 4)),
            waterLook: rand() < 0.1 ? "TRACE" : "NONE",
            solidsLook: rand() < 0.15 ? "TRACE" : "NONE",
            notes: rand() < 0.04 ? "Lid left open; rainwater likely." : "",
          },
        });
        todays.push({ code, material: s.material, litres, source: s.code });
      }
      // The drop-off bank's oil, and the planted fresh-oil collection, are kept in lots of their own.
      const ownLot = (p: { source: string }) =>
        p.source === WATER_SOURCE || (p.source === FRESH_OIL_SOURCE && day >= freshOilDay && !freshPlanted);
      const groups = [
        ...(["USED_COOKING_OIL", "TRAP_GREASE"] as const).map((material) => ({
          material,
          group: todays.filter((p) => p.material === material && !ownLot(p)),
          planted: null as string | null,
        })),
        ...todays.filter(ownLot).map((p) => ({ material: p.material, group: [p], planted: p.source })),
      ];
      if (todays.some((p) => p.source === FRESH_OIL_SOURCE && ownLot(p))) freshPlanted = true;
      for (const { material, group, planted } of groups) {
        if (group.length === 0) continue;
        lotSeq++;
        const code = `L-${String(lotSeq).padStart(4, "0")}`;
        const observedVolumeL = r1(group.reduce((s, p) => s + p.litres, 0) * between(0.985, 1.005));
        const observedTempC = r1(seasonTemp + between(0, 6));
        const m = measureObserved({
          material,
          observedVolumeL,
          observedTempC,
          referenceTempC: 15,
          table: DEFAULT_DENSITY_TABLE,
        });
        if (!m.ok) throw new Error("scenario: lot not measurable");
        const recvAt = t(day, 16, 30);
        ops.push({
          kind: "lotFromPickups",
          at: recvAt,
          actor: "production.tess",
          input: {
            code,
            material,
            receivedAt: recvAt,
            observedVolumeL,
            observedTempC,
            certified: group.length > 0 && material === "USED_COOKING_OIL",
            notes: "",
            pickupCodes: group.map((p) => p.code),
          },
        });
        if (planted === WATER_SOURCE) waterLots++;
        const usualWater = materialWater(material);
        const usualFfa = materialFfa(material);
        const water = planted === WATER_SOURCE && waterLots === 9 ? HEAVY_WATER_PCT : usualWater;
        const ffa = planted === FRESH_OIL_SOURCE ? FRESH_OIL_FFA : usualFfa;
        pendingLots.push({ code, grams: m.value.massG, material, ffa, water, reject: water > 2.5, day });
      }
    }

    // Deliveries from renderers and crushers.
    const deliveries: Array<{ s: { code: string; name: string; material: MaterialKind }; litres: number }> = [];
    if (weekday === 2 && day % 14 < 7)
      deliveries.push({ s: renderers[day % 2 === 0 ? 0 : 1] ?? renderers[0]!, litres: between(16_000, 22_000) });
    if (weekday === 4 && day % 28 < 7) deliveries.push({ s: renderers[2]!, litres: between(12_000, 18_000) });
    if (weekday === 3 && day % 42 < 7)
      deliveries.push({ s: crushers[(day / 42) % 2 < 1 ? 0 : 1]!, litres: between(18_000, 24_000) });
    for (const d of deliveries) {
      lotSeq++;
      const code = `L-${String(lotSeq).padStart(4, "0")}`;
      const observedVolumeL = r1(d.litres);
      const observedTempC = r1(d.s.material === "TALLOW" ? between(45, 55) : seasonTemp + between(2, 10));
      const m = measureObserved({
        material: d.s.material,
        observedVolumeL,
        observedTempC,
        referenceTempC: 15,
        table: DEFAULT_DENSITY_TABLE,
      });
      if (!m.ok) throw new Error("scenario: delivery not measurable");
      const at = t(day, 11);
      ops.push({
        kind: "delivery",
        at,
        actor: "production.tess",
        input: {
          code,
          material: d.s.material,
          receivedAt: at,
          observedVolumeL,
          observedTempC,
          certified: d.s.material === "SOYBEAN" || d.s.material === "CANOLA",
          notes: "",
          supplierCode: d.s.code,
          deliveryDocument: `DN-${d.s.code}-${day}`,
        },
      });
      pendingLots.push({
        code,
        grams: m.value.massG,
        material: d.s.material,
        ffa: materialFfa(d.s.material),
        water: materialWater(d.s.material),
        reject: false,
        day,
      });
    }

    // Reagent top-ups.
    if (reagentStock("METHANOL") < 9_000_000) receiveReagent("METHANOL", 18_000, t(day, 7, 15), 99.9);
    if (reagentStock("KOH") < 600_000) receiveReagent("KOH", 1_500, t(day, 7, 15), 90);
    if (reagentStock("H2SO4") < 200_000) receiveReagent("H2SO4", 600, t(day, 7, 15), 96);
    if (reagentStock("WATER") < 25_000_000) receiveReagent("WATER", 60_000, t(day, 7, 15), 100);

    // Batches: up to two a workday, from the fullest feedstock tank.
    const lastDay = day === days - 1;
    const batchesToday = lastDay ? 2 : isWorkday && rand() < 0.8 ? 1 : 0;
    for (let b = 0; b < batchesToday; b++) {
      const candidates = ["T1", "T2", "T3"].map((c) => tanks.get(c)!).filter((tk) => tk.stockG - tk.heelG > 5_000_000);
      if (candidates.length === 0) break;
      const tank = candidates.sort((a, z) => z.stockG - z.heelG - (a.stockG - a.heelG))[0]!;
      const oilG = Math.min(tank.stockG - tank.heelG, Math.round(between(6_000, 9_000) * 1000));
      const ffa = (tank.ffaMassG / tank.stockG) * 100;
      batchSeq++;
      const code = `B-${String(batchSeq).padStart(4, "0")}`;
      const pretreat = ffa > 5;
      const h = 11 + b * 5; // after the morning's lab decisions and tank transfers
      const oilKg = oilG / 1000;
      // Stoichiometry (stoichiometry, computed): 6:1 methanol at M(TG) ≈ 875 g/mol; KOH base dose 1 % of oil
      // (common practice) plus 1.986 g per kg per % FFA neutralised, at 90 % purity.
      const methanolKg = (oilKg / 875) * 6 * 32.042;
      const residualFfa = pretreat ? 0.8 : ffa;
      const kohKg = (oilKg * 0.01 + (oilKg * 1.986 * residualFfa) / 1000) / 0.9;
      const ffaKg = (oilKg * ffa) / 100;
      const acidKg = pretreat ? ffaKg * 0.05 : 0;
      const pretreatMethanolKg = pretreat ? (ffaKg / 282.47) * 20 * 32.042 : 0;
      const washKg = oilKg * 0.2;
      ops.push({
        kind: "planBatch",
        at: t(day, h - 1),
        actor: "production.tess",
        input: {
          code,
          plannedAt: t(day, h - 1),
          targetOilKg: r3(oilKg),
          molarRatio: 6,
          catalyst: "KOH",
          reactionTempC: 60,
          pretreated: pretreat,
          recipe: {
            blendFfaPct: r2(ffa),
            methanolKg: r3(methanolKg),
            catalystKg: r3(kohKg),
            acidKg: r3(acidKg),
            pretreatMethanolKg: r3(pretreatMethanolKg),
            washWaterKg: r3(washKg),
          },
          notes: pretreat ? "High FFA: acid esterification before the base step." : "",
        },
      });
      if (lastDay && b === batchesToday - 1) continue; // planned for tomorrow's shift
      tank.ffaMassG -= (tank.ffaMassG * oilG) / tank.stockG;
      tank.stockG -= oilG;
      const charges: BatchStartInput["charges"] = [
        { fromKind: "TANK", fromCode: tank.code, role: "OIL", massKg: oilKg },
      ];
      const addCharges = (
        reagent: "METHANOL" | "KOH" | "H2SO4",
        kg: number,
        role: "METHANOL" | "CATALYST" | "ACID",
      ) => {
        for (const part of drawReagent(reagent, Math.round(kg * 1000)))
          charges.push({ fromKind: "REAGENT_LOT", fromCode: part.code, role, massKg: part.grams / 1000 });
      };
      // Recovered methanol is used first, keeping a heel in its tank; fresh methanol makes up the rest.
      const m1 = tanks.get("M1")!;
      const methanolG = Math.round((methanolKg + pretreatMethanolKg) * 1000);
      const recycledG = Math.max(0, Math.min(methanolG, m1.stockG - 500_000));
      if (recycledG > 0) {
        charges.push({ fromKind: "TANK", fromCode: "M1", role: "METHANOL", massKg: recycledG / 1000 });
        m1.stockG -= recycledG;
      }
      addCharges("METHANOL", (methanolG - recycledG) / 1000, "METHANOL");
      addCharges("KOH", kohKg, "CATALYST");
      if (pretreat) addCharges("H2SO4", acidKg, "ACID");
      ops.push({
        kind: "startBatch",
        at: t(day, h),
        actor: "production.tess",
        input: { batchCode: code, startedAt: t(day, h), charges },
      });
      if (lastDay) continue; // still reacting at the end of the scenario
      const totalG = charges.reduce((s, c) => s + Math.round(c.massKg * 1000), 0);
      const esterG = Math.round(oilG * between(0.955, 0.985));
      const recoveredG = Math.round((methanolKg + pretreatMethanolKg) * 1000 * between(0.35, 0.5));
      // Water is not charged: it is used at the washing step and drawn off with what it washed out.
      const waterParts = drawReagent("WATER", Math.round(washKg * 1000));
      const waterG = waterParts.reduce((s, w) => s + w.grams, 0);
      const washOutG = Math.round(waterG * between(1.02, 1.06));
      // What no scale or gauge finds (hold-up in lines and filters, evaporation, weighing error): a few
      // tenths of a percent of the charge, and one batch with a leaking drain valve well above the
      // site's tolerance (common practice: warn above 0.5 %). A spill now and then is a recorded loss.
      const usualShare = between(0.002, 0.006) * 0.75;
      const unmeasuredG = Math.round(totalG * (batchSeq === LEAKY_BATCH ? 0.0115 : usualShare));
      const spillG = batchSeq % 9 === 4 ? (6 + (batchSeq % 5) * 3) * 1000 : 0;
      const glycerolG = totalG - esterG - recoveredG - (washOutG - waterG) - unmeasuredG - spillG;
      if (glycerolG <= 0) throw new Error("scenario: batch balance");
      if (glycerolBox.stockG + glycerolG > glycerolBox.capacityG)
        throw new Error("scenario: glycerol container overfull");
      if (washBox.stockG + washOutG > washBox.capacityG) {
        haul(washBox, day);
        washBox = openContainer("WASH_WATER", day);
      }
      glycerolBox.stockG += glycerolG;
      washBox.stockG += washOutG;
      if (m1.stockG + recoveredG > m1.capacityG) throw new Error("scenario: methanol tank overfull");
      m1.stockG += recoveredG;
      const done = t(day, h + 4);
      ops.push({
        kind: "completeBatch",
        at: done,
        actor: "production.tess",
        input: {
          batchCode: code,
          completedAt: done,
          outputs: [
            { role: "ESTER", toKind: "PRODUCT_LOT", toCode: `P-${code.slice(2)}`, massKg: esterG / 1000 },
            { role: "GLYCEROL_PHASE", toKind: "WASTE_CONTAINER", toCode: glycerolBox.code, massKg: glycerolG / 1000 },
            // One wash-water row per water lot drawn; the first carries what the washing took out of the batch.
            ...waterParts.map((w, i) => ({
              role: "WASH_WATER" as const,
              toKind: "WASTE_CONTAINER" as const,
              toCode: washBox.code,
              massKg: (i === 0 ? w.grams + washOutG - waterG : w.grams) / 1000,
              waterFromCode: w.code,
              waterKg: w.grams / 1000,
            })),
            { role: "RECOVERED_METHANOL", toKind: "TANK", toCode: "M1", massKg: recoveredG / 1000 },
            ...(spillG > 0
              ? [
                  {
                    role: "LOSS" as const,
                    massKg: spillG / 1000,
                    reason: "spilled at the decanter drain; cleaned up with absorbent",
                  },
                ]
              : []),
          ],
        },
      });
      heldProducts.push({ code: `P-${code.slice(2)}`, grams: esterG, readyDay: day + 1 });
    }

    // QC and release of yesterday's product (the last ten days' lots still await the lab), then into a
    // product tank. Results are judged against the lot's specification; one lot fails and stays on hold.
    for (const p of heldProducts.filter((x) => x.readyDay <= day && day < days - QC_PENDING_DAYS)) {
      const at = t(day, 10);
      rand(); // the draws the earlier five-result demo made, so the rest of the plant stays as it was
      for (let i = 0; i < 5; i++) rand();
      qcSeq++;
      const fail = qcSeq === FAILING_QC_LOT;
      for (const input of demoQcResults(p.code, at, fail))
        ops.push({ kind: "qc", at, actor: "compliance.nell", input });
      ops.push({ kind: "decideProduct", at: t(day, 11), actor: "compliance.nell", input: demoDecision(p.code, fail) });
      heldProducts.splice(heldProducts.indexOf(p), 1);
      if (fail) continue; // stays on hold for re-processing
      const dest = productTanks
        .map((c) => tanks.get(c)!)
        .filter((tk) => tk.stockG + p.grams <= tk.capacityG)
        .sort((a, z) => a.stockG - z.stockG)[0];
      if (!dest) continue;
      // In the last days a little of each released lot is kept back in the lot for drum orders, so the
      // demo has released lots that can be shipped directly.
      // (the six release days before the lots that still await the lab).
      const keptG = day >= days - QC_PENDING_DAYS - 6 ? Math.min(KEPT_BACK_G, p.grams - 1000) : 0;
      ops.push({
        kind: "transfer",
        at: t(day, 11, 30),
        actor: "production.tess",
        input: {
          fromKind: "PRODUCT_LOT",
          fromCode: p.code,
          toTankCode: dest.code,
          at: t(day, 11, 30),
          massKg: (p.grams - keptG) / 1000,
          note: keptG > 0 ? "released to tank; the rest kept back for drum orders" : "released to tank",
        },
      });
      dest.stockG += p.grams - keptG;
    }

    // Shipments by tanker when a product tank has enough above its heel.
    if (isWorkday) {
      for (const code of productTanks) {
        const tk = tanks.get(code)!;
        if (tk.stockG - tk.heelG < 24_000_000 || rand() < 0.3) continue;
        shipmentSeq++;
        const kg = Math.round(between(18_000, 23_000));
        const at = t(day, 14);
        // One tanker load from one product tank; the customer pick comes before the claim draw, as it always has.
        const customerCode = pick(CUSTOMERS).code;
        const vehicle = `Road tanker RT-${1 + (shipmentSeq % 3)}`;
        ops.push({
          kind: "ship",
          at,
          actor: "compliance.nell",
          input: {
            documentNo: `BOL-${String(shipmentSeq).padStart(4, "0")}`,
            customerCode,
            shippedAt: at,
            vehicle,
            compartment: "1–4",
            lines: [{ fromKind: "TANK", fromCode: code, massKg: kg, volumeL: r1(kg / 0.8805) }],
            certifiedClaim: rand() < 0.5,
            note: "",
          },
        });
        tk.stockG -= kg * 1000;
      }
    }

    // The glycerol phase goes out on the hauler's schedule; wash water when its container fills.
    if (glycerolHaulDays.includes(day) && glycerolBox.stockG > 0) {
      haul(glycerolBox, day);
      glycerolBox = openContainer("GLYCEROL_PHASE", day);
    }

    // Weekly gauges of the feedstock tanks (book stock ± a gauge error).
    if (weekday === 5) {
      for (const code of ["T1", "T2", "T3"]) {
        const tk = tanks.get(code)!;
        const rho = densityAt(requireDensityEntry(DEFAULT_DENSITY_TABLE, "USED_COOKING_OIL"), 20);
        ops.push({
          kind: "gauge",
          at: t(day, 17),
          actor: "production.rafe",
          input: { tankCode: code, at: t(day, 17), volumeL: r1((tk.stockG / rho) * between(0.996, 1.004)), tempC: 20 },
        });
      }
    }
  }

  // Monthly accounting periods; months that ended more than a month ago are closed.
  const firstMonth = new Date(start);
  let m = Date.UTC(firstMonth.getUTCFullYear(), firstMonth.getUTCMonth(), 1);
  while (m <= anchor) {
    const d = new Date(m);
    const next = Date.UTC(d.getUTCFullYear(), d.getUTCMonth() + 1, 1);
    ops.push({
      kind: "period",
      at: new Date(anchor),
      actor: "compliance.nell",
      input: { startsAt: new Date(m), endsAt: new Date(next) },
    });
    if (next <= anchor - 31 * DAY)
      ops.push({
        kind: "closePeriod",
        at: new Date(anchor),
        actor: "compliance.nell",
        input: { startsAt: new Date(m) },
      });
    m = next;
  }
  return ops;
}
