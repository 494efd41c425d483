// The chain-of-custody statement for a balance period: certified inputs by characteristic set,
// conversions per batch, certified claims on shipments and each account's period figures. Built from
// the custody page's own answer, so the page, CSV and PDF agree. Pure.
import type { ReportContext, ReportDoc, ReportTable } from "@/lib/report/report";
import { composeReport, periodDays } from "@/lib/report/report";
import type { CustodyReport } from "@/lib/custody/custody.service";

/** Certified inputs and the conversions of the batches finished in the period. */
function inputTables(r: CustodyReport, inPeriod: (at: Date) => boolean): ReportTable[] {
  const inputs: ReportTable = {
    key: "inputs",
    heading: "Certified inputs by characteristic set",
    columns: [
      { key: "set", header: "Characteristic set", kind: "text" },
      { key: "certificates", header: "Certificates", kind: "text" },
      { key: "input", header: "Certified input", kind: "mass" },
    ],
    rows: r.sets.map((s) => [s.key, s.certificates.map((c) => c.certificate).join(", "), s.inputG]),
    total: ["TOTAL", null, r.sets.reduce((s, x) => s + x.inputG, 0)],
    empty: "No certified input.",
  };
  const conversions = r.conversions.filter((c) => inPeriod(c.completedAt));
  const conv: ReportTable = {
    key: "conversions",
    heading: "Conversions (batches finished in the period)",
    columns: [
      { key: "batch", header: "Batch", kind: "text" },
      { key: "finished", header: "Finished", kind: "day" },
      { key: "oil", header: "Oil in", kind: "mass" },
      { key: "ester", header: "Ester out", kind: "mass" },
      { key: "yield", header: "Yield (ester / oil)", kind: "text" },
    ],
    rows: conversions.map((c) => [c.batchCode, c.completedAt, c.oilG, c.esterG, c.factor.toFixed(4)]),
    total: [
      "TOTAL",
      null,
      conversions.reduce((s, c) => s + c.oilG, 0),
      conversions.reduce((s, c) => s + c.esterG, 0),
      null,
    ],
    empty: "No batch finished in the period.",
  };
  return [inputs, conv];
}

/** The period's certified claims and its accounts. */
function claimTables(r: CustodyReport, inPeriod: (at: Date) => boolean): ReportTable[] {
  const claimsIn = r.claims.filter((c) => inPeriod(c.at));
  const claims: ReportTable = {
    key: "claims",
    heading: "Certified claims on shipments",
    columns: [
      { key: "document", header: "Shipment", kind: "text" },
      { key: "customer", header: "Customer", kind: "text" },
      { key: "shipped", header: "Shipped", kind: "day" },
      { key: "set", header: "Characteristic set", kind: "text" },
      { key: "claimed", header: "Claimed", kind: "mass" },
      { key: "available", header: "Credit available", kind: "mass" },
      { key: "accepted", header: "Within the balance", kind: "text" },
    ],
    rows: claimsIn.map((c) => [
      c.documentNo,
      c.customer,
      c.at,
      c.setKey,
      c.massG,
      c.availableG,
      c.accepted ? "yes" : `no, short ${(c.shortfallG / 1000).toFixed(3)} kg`,
    ]),
    total: ["TOTAL", null, null, null, claimsIn.reduce((s, c) => s + c.massG, 0), null, null],
    empty: "No certified claim in the period.",
  };
  const accounts: ReportTable = {
    key: "accounts",
    heading: `Accounts for ${r.selected.label}`,
    columns: [
      { key: "set", header: "Characteristic set", kind: "text" },
      { key: "material", header: "Material", kind: "text" },
      { key: "opening", header: "Opening", kind: "mass" },
      { key: "credits", header: "Credits", kind: "mass" },
      { key: "debits", header: "Debits", kind: "mass" },
      { key: "closing", header: "Closing", kind: "mass" },
      { key: "carried", header: "Carried forward", kind: "text" },
    ],
    rows: r.accounts.flatMap((a) =>
      a.selected
        ? [
            [
              a.setKey,
              a.materialLabel,
              a.selected.openingG,
              a.selected.creditsG,
              a.selected.debitsG,
              a.selected.closingG,
              a.selected.carriedForwardG === null ? "period open" : (a.selected.carriedForwardG / 1000).toFixed(3),
            ],
          ]
        : [],
    ),
    empty: "No account had entries in the period.",
  };
  return [claims, accounts];
}

export function buildCustodyDoc(r: CustodyReport, ctx: ReportContext): ReportDoc {
  const inPeriod = (at: Date) => at >= r.selected.startsAt && at < r.selected.endsAt;
  return composeReport(
    {
      slug: "custody",
      title: "Chain-of-custody statement",
      subject: `Balance period ${r.selected.label}: ${periodDays(r.selected.startsAt, r.selected.endsAt, ctx.timeZone)}`,
      facts: [
        ["Rule set", r.ruleSet.name],
        ["Operator", r.query.operatorType],
        ["Bookings that exceeded the balance", r.failures.length === 0 ? "none" : String(r.failures.length)],
      ],
      notes: [
        "Mass balance: certified input is credited by characteristic set, converted at each batch's measured yield, and debited by certified claims on shipments.",
      ],
      tables: [...inputTables(r, inPeriod), ...claimTables(r, inPeriod)],
    },
    ctx,
    { movements: r.trace.movements, lastMoveId: r.trace.lastMoveId },
  );
}
