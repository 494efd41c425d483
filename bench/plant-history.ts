// A synthetic plant history for the benchmark: years of pickups, lots, deliveries, reagent receipts,
// batches, product lots, shipments, waste containers and disposals, written straight as ledger moves
// (no services, no database) so that ten years take well under a second to build.
// The simulation keeps every holder's book stock and refuses to draw more than a holder holds, and it
// emits moves in time order, so the ledger it returns is one the trace replay accepts as it is.
// Feedstock and product tanks keep a heel and are never emptied: the worst case for genealogy, since a
// tank's mixture then depends on its whole history.
import type { HolderKind, MixingModel, MoveRole } from "@/lib/core/vocabulary";
import { convertCredit, RULESET_EU_2022_996 } from "@/lib/custody/custody-balance";
import type {
  CharacteristicSet,
  ClaimBooking,
  ConversionStep,
  CustodyBooking,
  CustodyState,
} from "@/lib/custody/custody-balance";
import { createRandom } from "@/bench/seeded-random";

export const DAY_MS = 86_400_000;
const MIN_MS = 60_000;
const KG = 1000;
const TONNE = 1_000_000;

/** A holder in the shape both lib/trace (TraceHolder) and lib/mass-balance (BalanceHolder) read. */
export interface PlantHolder {
  id: number;
  siteId: number;
  kind: HolderKind;
  code: string;
  mixing: MixingModel;
  materialKind: string | null;
  completedAt: number | null;
}

/** A move in the shape both TraceMove and BalanceMove read. */
export interface PlantMove {
  id: number;
  at: number;
  fromHolderId: number | null;
  toHolderId: number;
  massG: number;
  role: MoveRole;
}

export interface PlantCounts {
  days: number;
  holders: number;
  moves: number;
  pickups: number;
  lots: number;
  deliveryLots: number;
  certifiedLots: number;
  batches: number;
  productLots: number;
  shipments: number;
  reagentLots: number;
  wasteContainers: number;
  disposals: number;
  custodyBookings: number;
}

export interface PlantProbes {
  /** The last product lot made: its backward trace reaches back through the never-emptied tanks. */
  lateProductLotHolderId: number;
  lateProductBatchStartMs: number;
  /** An early certified lot (second month): its forward trace must follow it to the end of the ledger. */
  earlyLotHolderId: number;
  earlyLotOriginIds: number[];
  earlyLotFirstEntryMs: number;
  lastShipmentMoveId: number;
  lastShipmentAt: number;
}

export interface PlantHistory {
  years: number;
  seed: number;
  siteId: number;
  startMs: number;
  endMs: number;
  holders: PlantHolder[];
  /** In ledger order: ascending (at, id). */
  moves: PlantMove[];
  /** Book stock of every holder at the end (for the Holder.stockG column). */
  finalStockG: Map<number, number>;
  counts: PlantCounts;
  probes: PlantProbes;
  custody: CustodyState;
  /** A claim that fits the remaining balance, for checkClaim. */
  extraClaim: ClaimBooking;
}

export interface PlantOptions {
  years: number;
  seed?: number;
  /** The history ends here (UTC midnight, a quarter start so the last quarter is complete). */
  endMs?: number;
  siteId?: number;
}

export const DEFAULT_END_MS = Date.UTC(2026, 9, 1);

/**
 * The plant's fixed tanks, in the order their holders are made: capacity in tonnes, the heel kept as a
 * share of it, the material held and the service the app would give the tank (npm run load -- --years
 * records them as the app's tanks).
 */
export const PLANT_TANKS = [
  { code: "T1", capacityT: 80, heelFraction: 0.08, materialKind: "USED_COOKING_OIL", service: "FEEDSTOCK" },
  { code: "T2", capacityT: 60, heelFraction: 0.08, materialKind: "YELLOW_GREASE", service: "FEEDSTOCK" },
  { code: "T3", capacityT: 60, heelFraction: 0.08, materialKind: "TALLOW", service: "FEEDSTOCK" },
  { code: "P1", capacityT: 120, heelFraction: 0.04, materialKind: "FAME", service: "PRODUCT" },
  { code: "P2", capacityT: 120, heelFraction: 0.04, materialKind: "FAME", service: "PRODUCT" },
  { code: "M1", capacityT: 20, heelFraction: 0.015, materialKind: "METHANOL", service: "METHANOL" },
] as const;

type ReagentKind = "METHANOL" | "KOH" | "H2SO4" | "WATER";

interface ReagentLot {
  holderId: number;
  reagent: ReagentKind;
}

interface WaitingLot {
  holderId: number;
  tank: string;
  readyDay: number;
}

interface WaitingProduct {
  holderId: number;
  readyDay: number;
}

interface Container {
  holderId: number;
  capacityG: number;
}

const SET_UCO = "SCHEME-A|CERT-A-0117|USED_COOKING_OIL";
const SET_CROP = "SCHEME-B|CERT-B-0042|CROP";

const CUSTODY_SETS: CharacteristicSet[] = [
  {
    key: SET_UCO,
    attributes: { scheme: "Scheme A (synthetic)", certificate: "CERT-A-0117", material: "USED_COOKING_OIL" },
  },
  {
    key: SET_CROP,
    attributes: { scheme: "Scheme B (synthetic)", certificate: "CERT-B-0042", material: "SOYBEAN, CANOLA" },
  },
];

// Measured-yield style factors for the synthetic custody ledger only (benchmark data, no source needed).
const CUSTODY_STEPS: ConversionStep[] = [
  {
    id: "UCO_TO_FAME",
    inputMaterial: "USED_COOKING_OIL",
    outputs: [{ material: "FAME", outputMassG: 965, inputMassG: 1000 }],
    basis: "synthetic",
  },
  {
    id: "SOYBEAN_TO_FAME",
    inputMaterial: "SOYBEAN",
    outputs: [{ material: "FAME", outputMassG: 970, inputMassG: 1000 }],
    basis: "synthetic",
  },
  {
    id: "CANOLA_TO_FAME",
    inputMaterial: "CANOLA",
    outputs: [{ material: "FAME", outputMassG: 970, inputMassG: 1000 }],
    basis: "synthetic",
  },
];

export function generatePlantHistory(options: PlantOptions): PlantHistory {
  const seed = options.seed ?? 20_261_202;
  const rand = createRandom(seed + options.years * 7919);
  const siteId = options.siteId ?? 1;
  const endMs = options.endMs ?? DEFAULT_END_MS;
  const end = new Date(endMs);
  const startMs = Date.UTC(end.getUTCFullYear() - options.years, end.getUTCMonth(), end.getUTCDate());
  const days = Math.round((endMs - startMs) / DAY_MS);

  const holders: PlantHolder[] = [];
  const moves: PlantMove[] = [];
  const stock: number[] = [0];
  const bookings: CustodyBooking[] = [];
  const credit = new Map<string, number>();
  const counts = {
    pickups: 0,
    lots: 0,
    deliveryLots: 0,
    certifiedLots: 0,
    batches: 0,
    productLots: 0,
    shipments: 0,
    reagentLots: 0,
    wasteContainers: 0,
    disposals: 0,
  };
  let lastAt = Number.NEGATIVE_INFINITY;

  const addHolder = (
    kind: HolderKind,
    code: string,
    extra: { mixing?: MixingModel; materialKind?: string | null } = {},
  ): number => {
    const id = holders.length + 1;
    holders.push({
      id,
      siteId,
      kind,
      code,
      mixing: extra.mixing ?? "MIXED",
      materialKind: extra.materialKind ?? null,
      completedAt: null,
    });
    stock[id] = 0;
    return id;
  };
  const stockOf = (holderId: number): number => stock[holderId] ?? 0;
  const move = (at: number, fromHolderId: number | null, toHolderId: number, massG: number, role: MoveRole): number => {
    if (at < lastAt) throw new Error(`generator: move at ${at} is before the previous move at ${lastAt}`);
    if (!Number.isSafeInteger(massG) || massG <= 0) throw new Error(`generator: bad mass ${massG}`);
    if (fromHolderId !== null) {
      const held = stockOf(fromHolderId);
      if (held < massG) throw new Error(`generator: overdraw of holder ${fromHolderId} (${held} g < ${massG} g)`);
      stock[fromHolderId] = held - massG;
    }
    stock[toHolderId] = stockOf(toHolderId) + massG;
    const id = moves.length + 1;
    moves.push({ id, at, fromHolderId, toHolderId, massG, role });
    lastAt = at;
    return id;
  };
  const grams = (kg: number): number => Math.round(kg * KG);
  const creditKey = (set: string, material: string) => `${set}|${material}`;
  const creditOf = (set: string, material: string): number => credit.get(creditKey(set, material)) ?? 0;
  const addCredit = (set: string, material: string, g: number) =>
    credit.set(creditKey(set, material), creditOf(set, material) + g);

  // ---- fixed equipment ----------------------------------------------------------------------
  const lossHolder = addHolder("LOSS", "LOSS");
  interface TankDef {
    code: string;
    holderId: number;
    capacityG: number;
    heelG: number;
  }
  const tank = (code: string, capacityT: number, heelFraction: number, materialKind: string): TankDef => ({
    code,
    holderId: addHolder("TANK", code, { materialKind }),
    capacityG: capacityT * TONNE,
    heelG: Math.round(capacityT * TONNE * heelFraction),
  });
  const made = PLANT_TANKS.map((t) => ({ ...t, def: tank(t.code, t.capacityT, t.heelFraction, t.materialKind) }));
  const feedTanks = made.filter((t) => t.service === "FEEDSTOCK").map((t) => t.def);
  const productTanks = made.filter((t) => t.service === "PRODUCT").map((t) => t.def);
  const methanolTank = made.find((t) => t.service === "METHANOL")?.def;
  if (methanolTank === undefined) throw new Error("generator: no methanol tank");
  const tankByCode = new Map([...feedTanks, ...productTanks, methanolTank].map((t) => [t.code, t]));
  const requireTank = (code: string): TankDef => {
    const t = tankByCode.get(code);
    if (t === undefined) throw new Error(`generator: no tank ${code}`);
    return t;
  };

  // ---- sources --------------------------------------------------------------------------------
  interface PickupSource {
    code: string;
    material: "USED_COOKING_OIL" | "TRAP_GREASE";
    certified: boolean;
  }
  const restaurants: PickupSource[] = Array.from({ length: 110 }, (_, i) => ({
    code: `R${i + 1}`,
    material: "USED_COOKING_OIL",
    certified: i % 3 !== 2,
  }));
  const trapSources: PickupSource[] = Array.from({ length: 14 }, (_, i) => ({
    code: `G${i + 1}`,
    material: "TRAP_GREASE",
    certified: false,
  }));
  const deliverySuppliers = [
    { code: "D1", material: "YELLOW_GREASE", tank: "T2", certified: false },
    { code: "D2", material: "YELLOW_GREASE", tank: "T2", certified: false },
    { code: "D3", material: "TALLOW", tank: "T3", certified: false },
    { code: "C1", material: "SOYBEAN", tank: "T3", certified: true },
    { code: "C2", material: "CANOLA", tank: "T3", certified: true },
  ] as const;

  // ---- reagents -------------------------------------------------------------------------------
  const reagentLots: ReagentLot[] = [];
  const reagentSpec: Record<ReagentKind, { lotKg: number; reorderBelowKg: number }> = {
    METHANOL: { lotKg: 20_000, reorderBelowKg: 6_000 },
    KOH: { lotKg: 2_000, reorderBelowKg: 400 },
    H2SO4: { lotKg: 1_000, reorderBelowKg: 150 },
    WATER: { lotKg: 60_000, reorderBelowKg: 5_000 },
  };
  const reagentStock = (reagent: ReagentKind) =>
    reagentLots.filter((l) => l.reagent === reagent).reduce((s, l) => s + stockOf(l.holderId), 0);
  const receiveReagent = (reagent: ReagentKind, at: number) => {
    counts.reagentLots++;
    const holderId = addHolder("REAGENT_LOT", `${reagent}-${counts.reagentLots}`, { materialKind: reagent });
    reagentLots.push({ holderId, reagent });
    move(at, null, holderId, grams(reagentSpec[reagent].lotKg * rand.between(0.98, 1.0)), "RECEIPT");
  };
  const drawReagent = (reagent: ReagentKind, g: number, at: number, batchHolderId: number, role: MoveRole) => {
    let left = g;
    for (const lot of reagentLots) {
      if (left <= 0) break;
      if (lot.reagent !== reagent) continue;
      const take = Math.min(stockOf(lot.holderId), left);
      if (take <= 0) continue;
      move(at, lot.holderId, batchHolderId, take, role);
      left -= take;
    }
    if (left > 0) throw new Error(`generator: ran out of ${reagent}`);
    // Spent lots stay in the books but are no longer scanned.
    for (let i = reagentLots.length - 1; i >= 0; i--) {
      const lot = reagentLots[i];
      if (lot !== undefined && stockOf(lot.holderId) === 0) reagentLots.splice(i, 1);
    }
  };

  // ---- waste ----------------------------------------------------------------------------------
  const openContainer = (stream: "GLYCEROL_PHASE" | "WASH_WATER"): Container => {
    counts.wasteContainers++;
    const holderId = addHolder(
      "WASTE_CONTAINER",
      `${stream === "GLYCEROL_PHASE" ? "GLY" : "WW"}-${counts.wasteContainers}`,
      { materialKind: stream },
    );
    return { holderId, capacityG: stream === "GLYCEROL_PHASE" ? 100 * TONNE : 40 * TONNE };
  };
  const haul = (box: Container, at: number) => {
    counts.disposals++;
    const disposal = addHolder("DISPOSAL", `MAN-${counts.disposals}`);
    move(at, box.holderId, disposal, stockOf(box.holderId), "DISPOSAL");
  };
  let glycerolBox = openContainer("GLYCEROL_PHASE");
  let washBox = openContainer("WASH_WATER");

  // ---- the days -------------------------------------------------------------------------------
  const waitingLots: WaitingLot[] = [];
  const waitingProducts: WaitingProduct[] = [];
  let lateProduct: { holderId: number; batchStartMs: number } | null = null;
  let earlyLot: { holderId: number; originIds: number[]; firstEntryMs: number } | null = null;
  let lastShipment: { moveId: number; at: number } | null = null;
  let bookingSeq = 0;
  const book = (b: WithoutId<CustodyBooking>) => {
    bookingSeq++;
    bookings.push({ ...b, id: `b${bookingSeq}` });
  };

  for (let day = 0; day < days; day++) {
    const dayMs = startMs + day * DAY_MS;
    const at = (hour: number, minute = 0) => dayMs + hour * 3_600_000 + minute * MIN_MS;
    const weekday = new Date(dayMs).getUTCDay();
    const workday = weekday >= 1 && weekday <= 5;

    // 06:00 reagent top-ups
    for (const reagent of ["METHANOL", "KOH", "H2SO4", "WATER"] as const) {
      if (reagentStock(reagent) < reagentSpec[reagent].reorderBelowKg * KG) receiveReagent(reagent, at(6));
    }

    // 07:00 pickups along the routes, Monday to Saturday
    const todays: Array<{ holderId: number; entryMoveId: number; source: PickupSource }> = [];
    if (weekday !== 0) {
      const n = rand.integer(18, 26);
      for (let i = 0; i < n; i++) {
        const source = rand.next() < 0.15 ? rand.pick(trapSources) : rand.pick(restaurants);
        counts.pickups++;
        const holderId = addHolder("PICKUP", `PU-${counts.pickups}`, { materialKind: source.material });
        const kg = source.material === "TRAP_GREASE" ? rand.between(250, 750) : rand.between(60, 300);
        const entryMoveId = move(at(7, i * 7), null, holderId, grams(kg), "RECEIPT");
        todays.push({ holderId, entryMoveId, source });
      }
    }

    // 10:30 accepted lots into their tanks (a lot waits in its totes while the tank is too full)
    for (let i = 0; i < waitingLots.length;) {
      const lot = waitingLots[i];
      if (lot === undefined) break;
      const t = requireTank(lot.tank);
      const g = stockOf(lot.holderId);
      if (lot.readyDay <= day && stockOf(t.holderId) + g <= t.capacityG) {
        move(at(10, 30), lot.holderId, t.holderId, g, "TRANSFER");
        waitingLots.splice(i, 1);
      } else {
        i++;
      }
    }

    // 11:00 tanker deliveries from renderers and crushers
    if (workday && rand.next() < 0.3) {
      const supplier = rand.pick(deliverySuppliers);
      counts.lots++;
      counts.deliveryLots++;
      const holderId = addHolder("LOT", `L-${counts.lots}`, { materialKind: supplier.material });
      const g = grams(rand.between(12_000, 20_000));
      move(at(11), null, holderId, g, "RECEIPT");
      waitingLots.push({ holderId, tank: supplier.tank, readyDay: day + 1 });
      if (supplier.certified) {
        counts.certifiedLots++;
        book({ kind: "INPUT", at: at(11), setKey: SET_CROP, material: supplier.material, massG: g });
        addCredit(SET_CROP, supplier.material, g);
      }
    }

    // 11:30 released product lots into the product tanks
    for (let i = 0; i < waitingProducts.length;) {
      const p = waitingProducts[i];
      if (p === undefined) break;
      const g = stockOf(p.holderId);
      const dest = productTanks
        .filter((t) => stockOf(t.holderId) + g <= t.capacityG)
        .sort((a, b) => stockOf(a.holderId) - stockOf(b.holderId))[0];
      if (p.readyDay <= day && dest !== undefined) {
        move(at(11, 30), p.holderId, dest.holderId, g, "TRANSFER");
        waitingProducts.splice(i, 1);
      } else {
        i++;
      }
    }

    // 12:00 and 15:00 batches, Monday to Friday, from the fullest feedstock tank above its heel
    for (const startHour of workday ? [12, 15] : []) {
      const source = feedTanks
        .filter((t) => stockOf(t.holderId) - t.heelG >= 6 * TONNE)
        .sort((a, b) => stockOf(b.holderId) - b.heelG - (stockOf(a.holderId) - a.heelG))[0];
      if (source === undefined) break;
      const startAt = at(startHour);
      const oilG = Math.min(stockOf(source.holderId) - source.heelG, grams(rand.between(8_000, 10_000)));
      counts.batches++;
      const batchId = addHolder("BATCH", `B-${counts.batches}`);
      move(startAt, source.holderId, batchId, oilG, "OIL");
      const methanolG = Math.round(oilG * 0.22);
      const recycledG = Math.max(0, Math.min(methanolG, stockOf(methanolTank.holderId) - 300 * KG));
      if (recycledG > 0) move(startAt, methanolTank.holderId, batchId, recycledG, "METHANOL");
      if (methanolG - recycledG > 0) drawReagent("METHANOL", methanolG - recycledG, startAt, batchId, "METHANOL");
      drawReagent("KOH", Math.round(oilG * (source.code === "T2" ? 0.015 : 0.012)), startAt, batchId, "CATALYST");
      if (source.code === "T2") drawReagent("H2SO4", Math.round(oilG * 0.005), startAt, batchId, "ACID");
      const waterG = Math.round(oilG * 0.2);
      drawReagent("WATER", waterG, startAt, batchId, "WATER");

      if (source.code === "T1") {
        const inputG = Math.min(Math.floor(oilG * 0.7), creditOf(SET_UCO, "USED_COOKING_OIL"));
        if (inputG >= KG) convert(SET_UCO, "USED_COOKING_OIL", "UCO_TO_FAME", inputG, startAt);
      } else if (source.code === "T3") {
        const material = creditOf(SET_CROP, "SOYBEAN") >= creditOf(SET_CROP, "CANOLA") ? "SOYBEAN" : "CANOLA";
        const inputG = Math.min(Math.floor(oilG * 0.5), creditOf(SET_CROP, material));
        if (inputG >= KG)
          convert(SET_CROP, material, material === "SOYBEAN" ? "SOYBEAN_TO_FAME" : "CANOLA_TO_FAME", inputG, startAt);
      }

      const doneAt = at(startHour + 2);
      const totalG = stockOf(batchId);
      const esterG = Math.round(oilG * rand.between(0.955, 0.975));
      const recoveredG = Math.round(methanolG * rand.between(0.35, 0.45));
      const washOutG = Math.round(waterG * rand.between(1.02, 1.06));
      const lossG = Math.round(totalG * rand.between(0.002, 0.005));
      const glycerolG = totalG - esterG - recoveredG - washOutG - lossG;
      if (glycerolG <= 0) throw new Error("generator: batch outputs exceed inputs");
      if (stockOf(glycerolBox.holderId) + glycerolG > glycerolBox.capacityG) {
        haul(glycerolBox, doneAt - MIN_MS);
        glycerolBox = openContainer("GLYCEROL_PHASE");
      }
      if (stockOf(washBox.holderId) + washOutG > washBox.capacityG) {
        haul(washBox, doneAt - MIN_MS);
        washBox = openContainer("WASH_WATER");
      }
      counts.productLots++;
      const productId = addHolder("PRODUCT_LOT", `P-${counts.batches}`, { materialKind: "FAME" });
      move(doneAt, batchId, productId, esterG, "ESTER");
      move(doneAt, batchId, glycerolBox.holderId, glycerolG, "GLYCEROL_PHASE");
      move(doneAt, batchId, washBox.holderId, washOutG, "WASH_WATER");
      move(doneAt, batchId, methanolTank.holderId, recoveredG, "RECOVERED_METHANOL");
      move(doneAt, batchId, lossHolder, lossG, "LOSS");
      if (stockOf(batchId) !== 0) throw new Error("generator: batch not emptied");
      const batch = holders[batchId - 1];
      if (batch !== undefined) batch.completedAt = doneAt;
      waitingProducts.push({ holderId: productId, readyDay: day + 1 });
      lateProduct = { holderId: productId, batchStartMs: startAt };
    }

    // 18:00 shipments by road tanker when a product tank has a load above its heel
    if (workday) {
      for (const t of productTanks) {
        if (stockOf(t.holderId) - t.heelG < 25 * TONNE || rand.next() < 0.3) continue;
        counts.shipments++;
        const shipmentId = addHolder("SHIPMENT", `BOL-${counts.shipments}`, { materialKind: "FAME" });
        const g = grams(rand.between(20_000, 24_000));
        const shippedAt = at(18);
        const moveId = move(shippedAt, t.holderId, shipmentId, g, "SHIPMENT");
        lastShipment = { moveId, at: shippedAt };
        if (rand.next() < 0.5) {
          const set = creditOf(SET_UCO, "FAME") >= creditOf(SET_CROP, "FAME") ? SET_UCO : SET_CROP;
          const claimG = Math.min(g, creditOf(set, "FAME"));
          if (claimG >= KG) {
            book({ kind: "CLAIM", at: shippedAt, setKey: set, material: "FAME", massG: claimG });
            addCredit(set, "FAME", -claimG);
          }
        }
      }
    }

    // 18:30 the day's pickups received as lots: one material and certification status per lot
    const groups = new Map<string, typeof todays>();
    for (const p of todays) {
      const key = `${p.source.material}|${p.source.certified}`;
      const group = groups.get(key);
      if (group === undefined) groups.set(key, [p]);
      else group.push(p);
    }
    for (const group of groups.values()) {
      for (let i = 0; i < group.length;) {
        const size = rand.integer(3, 5);
        const members = group.slice(i, i + size);
        i += size;
        const first = members[0];
        if (first === undefined) continue;
        counts.lots++;
        const material = first.source.material;
        const holderId = addHolder("LOT", `L-${counts.lots}`, { materialKind: material });
        const receivedAt = at(18, 30);
        let pickedUpG = 0;
        for (const p of members) {
          const g = stockOf(p.holderId);
          pickedUpG += g;
          move(receivedAt, p.holderId, holderId, g, "TRANSFER");
        }
        const measuredG = Math.round(pickedUpG * rand.between(0.985, 1.004));
        const originIds = members.map((p) => p.entryMoveId);
        if (measuredG < pickedUpG) move(receivedAt, holderId, lossHolder, pickedUpG - measuredG, "LOSS");
        if (measuredG > pickedUpG) originIds.push(move(receivedAt, null, holderId, measuredG - pickedUpG, "RECEIPT"));
        waitingLots.push({ holderId, tank: material === "USED_COOKING_OIL" ? "T1" : "T2", readyDay: day + 1 });
        if (first.source.certified) {
          counts.certifiedLots++;
          book({ kind: "INPUT", at: receivedAt, setKey: SET_UCO, material, massG: measuredG });
          addCredit(SET_UCO, material, measuredG);
          if (earlyLot === null && day >= 40) {
            const firstEntry = moves[first.entryMoveId - 1];
            earlyLot = { holderId, originIds, firstEntryMs: firstEntry?.at ?? receivedAt };
          }
        }
      }
    }
  }

  function convert(set: string, material: string, stepId: string, inputG: number, at: number): void {
    book({ kind: "CONVERSION", at, setKey: set, stepId, inputMassG: inputG });
    addCredit(set, material, -inputG);
    const step = CUSTODY_STEPS.find((s) => s.id === stepId);
    for (const o of step?.outputs ?? []) addCredit(set, o.material, convertCredit(inputG, o));
  }

  if (lateProduct === null || earlyLot === null || lastShipment === null) {
    throw new Error(
      `generator: ${options.years} years are too short for the probes (product lot, early lot, shipment)`,
    );
  }
  const claimSet = creditOf(SET_UCO, "FAME") >= creditOf(SET_CROP, "FAME") ? SET_UCO : SET_CROP;
  const extraClaim: ClaimBooking = {
    id: "extra-claim",
    kind: "CLAIM",
    at: endMs - MIN_MS,
    setKey: claimSet,
    material: "FAME",
    massG: Math.max(1, Math.min(1_000 * KG, creditOf(claimSet, "FAME"))),
  };
  const finalStockG = new Map<number, number>();
  for (const h of holders) finalStockG.set(h.id, stockOf(h.id));
  return {
    years: options.years,
    seed,
    siteId,
    startMs,
    endMs,
    holders,
    moves,
    finalStockG,
    counts: { days, holders: holders.length, moves: moves.length, ...counts, custodyBookings: bookings.length },
    probes: {
      lateProductLotHolderId: lateProduct.holderId,
      lateProductBatchStartMs: lateProduct.batchStartMs,
      earlyLotHolderId: earlyLot.holderId,
      earlyLotOriginIds: earlyLot.originIds,
      earlyLotFirstEntryMs: earlyLot.firstEntryMs,
      lastShipmentMoveId: lastShipment.moveId,
      lastShipmentAt: lastShipment.at,
    },
    custody: {
      siteId,
      ruleSet: RULESET_EU_2022_996,
      operatorType: "OTHER_OPERATOR",
      utcOffsetMin: 0,
      sets: CUSTODY_SETS,
      steps: CUSTODY_STEPS,
      bookings,
    },
    extraClaim,
  };
}

type WithoutId<T> = T extends unknown ? Omit<T, "id"> : never;

/** UTC midnight of the first day of the month containing t. */
export function getMonthStartMs(t: number): number {
  const d = new Date(t);
  return Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), 1);
}
