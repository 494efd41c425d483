// A lot's history on paper: what came in (pickups or the delivery), its lab results, and where its
// material went, from the lot page's own records. Pure.
import { labelOf } from "@/lib/core/vocabulary";
import type { LotDetail, LotFlow } from "@/lib/feedstock/lot-detail.store";
import { reportTime } from "@/lib/report/report";
import type { ReportContext, ReportDoc, ReportTable } from "@/lib/report/report";
import { composeReport } from "@/lib/report/report";

function pickupsTable(lot: LotDetail): ReportTable {
  return {
    key: "pickups",
    heading: "Pickups received into the lot",
    columns: [
      { key: "pickup", header: "Pickup", kind: "text" },
      { key: "source", header: "Source", kind: "text" },
      { key: "observed", header: "Observed", kind: "time" },
      { key: "volume_l", header: "Volume (L)", kind: "text" },
      { key: "mass", header: "Mass (estimate)", kind: "mass" },
    ],
    rows: lot.pickups.map((p) => [
      p.code,
      `${p.sourceCode} ${p.sourceName}`,
      p.observedAt,
      (p.volumeMl / 1000).toFixed(1),
      p.massG,
    ]),
    total: [
      "TOTAL",
      null,
      null,
      (lot.pickups.reduce((s, p) => s + p.volumeMl, 0) / 1000).toFixed(1),
      lot.pickups.reduce((s, p) => s + p.massG, 0),
    ],
    empty: lot.origin === "DELIVERY" ? "Delivered, not from pickups." : "No pickups.",
  };
}

function labTable(lot: LotDetail): ReportTable {
  return {
    key: "lab",
    heading: "Lab results",
    columns: [
      { key: "tested", header: "Tested", kind: "time" },
      { key: "test", header: "Test", kind: "text" },
      { key: "result", header: "Result", kind: "text" },
      { key: "analyst", header: "Analyst", kind: "text" },
      { key: "state", header: "State", kind: "text" },
    ],
    rows: [
      ...lot.titrations.map((t) => [
        t.testedAt,
        "FFA by titration",
        `${t.ffaPct.toFixed(2)} % FFA (acid value ${t.acidValue.toFixed(2)} mg KOH/g)`,
        t.analyst,
        t.voided ? "voided" : "valid",
      ]),
      ...lot.labTests.map((t) => [
        t.testedAt,
        `${labelOf(t.kind)} (${t.method})`,
        `${t.valuePct.toFixed(2)} %`,
        t.analyst,
        t.voided ? "voided" : "valid",
      ]),
    ],
    empty: "No lab result recorded.",
  };
}

function wentTable(flow: LotFlow): ReportTable {
  return {
    key: "where-it-went",
    heading: "Where its material went",
    columns: [
      { key: "holder", header: "To", kind: "holder" },
      { key: "kind", header: "Kind", kind: "text" },
      { key: "first", header: "First", kind: "day" },
      { key: "received", header: "Received", kind: "mass" },
      { key: "held", header: "Still there", kind: "mass" },
    ],
    rows: flow.destinations.map((d) => [d.holder, labelOf(d.holder.kind), d.firstAt, d.receivedG, d.heldG]),
    empty: "The lot's material has not moved.",
  };
}

function cameFrom(lot: LotDetail): string {
  if (lot.origin !== "DELIVERY") return `${lot.pickups.length} pickups`;
  const from = lot.supplier ? `${lot.supplier.code} ${lot.supplier.name}` : "a supplier";
  return `Delivery ${lot.deliveryDocument ?? ""} from ${from}`;
}

export function buildLotHistoryDoc(
  lot: LotDetail,
  flow: LotFlow,
  ctx: ReportContext,
  ledger: ReportDoc["ledger"],
): ReportDoc {
  return composeReport(
    {
      slug: "lot-history",
      title: "Lot history",
      subject: `Lot ${lot.code}, ${labelOf(lot.material)}, received ${reportTime(lot.receivedAt, ctx.timeZone)}`,
      facts: [
        ["Status", labelOf(lot.status)],
        ["Came from", cameFrom(lot)],
        ["Certified material", lot.certified ? "yes" : "no"],
        ["Mass received", `${(lot.massG / 1000).toFixed(3)} kg`],
        ["Book stock now", `${(lot.stockG / 1000).toFixed(3)} kg`],
        [
          "Of it still in the lot",
          `${(flow.stillInLotG / 1000).toFixed(3)} kg of ${(flow.enteredG / 1000).toFixed(3)} kg that entered`,
        ],
      ],
      notes:
        flow.method === "trace"
          ? []
          : [
              `Where it went is ${flow.method === "booking-order" ? "replayed in booking order" : "every later movement out of a place it reached"}: ${flow.traceProblem ?? ""}`,
            ],
      tables: [pickupsTable(lot), labTable(lot), wentTable(flow)],
    },
    ctx,
    ledger,
  );
}
