import type { AccountView, ClaimRow, ConversionRow, CustodyReport } from "@/lib/custody/custody.service";
import { kg, kgExact, num, when } from "@/app/_ui/format";
import { DataTable } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { HolderLink } from "@/app/_ui/ui";

type Summary = NonNullable<AccountView["selected"]>;
const ofPeriod = (a: AccountView, grams: (s: Summary) => number) => (a.selected ? kg(grams(a.selected), 3) : "—");

const ACCOUNT_COLUMNS: ReadonlyArray<Column<AccountView>> = [
  { key: "set", header: "Characteristic set", cell: (a) => a.setKey },
  { key: "material", header: "Material", cell: (a) => a.materialLabel },
  { key: "opening", header: "Opening", numeric: true, cell: (a) => ofPeriod(a, (s) => s.openingG) },
  { key: "credits", header: "Credits", numeric: true, cell: (a) => ofPeriod(a, (s) => s.creditsG) },
  { key: "debits", header: "Debits", numeric: true, cell: (a) => ofPeriod(a, (s) => s.debitsG) },
  { key: "closing", header: "Closing", numeric: true, cell: (a) => ofPeriod(a, (s) => s.closingG) },
  {
    key: "carried",
    header: "Carried forward",
    numeric: true,
    cell: (a) =>
      a.selected === null ? (
        "—"
      ) : a.selected.carriedForwardG === null ? (
        <span className="muted">period open</span>
      ) : (
        kg(a.selected.carriedForwardG, 3)
      ),
  },
];

export function AccountsTable({ r }: { r: CustodyReport }) {
  return (
    <DataTable
      caption={`Balances in ${r.selected.label}`}
      hideCaption
      rows={r.accounts}
      rowKey={(a) => `${a.setKey}|${a.material}`}
      empty="No certified credit has been booked."
      columns={ACCOUNT_COLUMNS}
    />
  );
}

interface CertificateRow {
  setKey: string;
  first: boolean;
  certificate: string;
  sources: string[];
  grams: number;
}

const INPUT_COLUMNS: ReadonlyArray<Column<CertificateRow>> = [
  { key: "set", header: "Characteristic set", cell: (c) => (c.first ? c.setKey : "") },
  { key: "certificate", header: "Source certificate", cell: (c) => c.certificate },
  {
    key: "sources",
    header: "Sources",
    cell: (c) =>
      c.sources.map((code, j) => (
        <span key={code}>
          {j > 0 ? ", " : ""}
          <a href={`/sources/${encodeURIComponent(code)}`}>{code}</a>
        </span>
      )),
  },
  { key: "input", header: "Certified input (all periods)", numeric: true, cell: (c) => kg(c.grams, 3) },
];

export function InputsTable({ sets }: { sets: CustodyReport["sets"] }) {
  const rows = sets.flatMap((s) => s.certificates.map((c, i) => ({ setKey: s.key, first: i === 0, ...c })));
  return (
    <DataTable
      caption="Certified inputs by characteristic set"
      hideCaption
      rows={rows}
      rowKey={(c) => `${c.setKey}|${c.certificate}`}
      empty="No certified feedstock has been received."
      columns={INPUT_COLUMNS}
    />
  );
}

export function ConversionTable({ rows, timeZone }: { rows: readonly ConversionRow[]; timeZone: string }) {
  const columns: Array<Column<ConversionRow>> = [
    {
      key: "batch",
      header: "Batch",
      cell: (c) => <HolderLink holder={{ kind: "BATCH", code: c.batchCode }} showKind={false} />,
    },
    {
      key: "finished",
      header: "Finished",
      cell: (c) => <span className="nowrap">{when(c.completedAt, timeZone)}</span>,
    },
    { key: "oil", header: "Oil in", numeric: true, cell: (c) => kg(c.oilG, 3) },
    { key: "ester", header: "Ester out", numeric: true, cell: (c) => kg(c.esterG, 3) },
    { key: "factor", header: "Factor", numeric: true, cell: (c) => num(c.factor, 4) },
    {
      key: "credit",
      header: "Certified oil → ester credit",
      cell: (c) =>
        c.bySet.length === 0 ? (
          <span className="muted">no certified oil</span>
        ) : (
          c.bySet.map((s) => (
            <div key={s.setKey}>
              {s.setKey}: {kg(s.certifiedOilG, 1)} → {kg(s.fameCreditG, 1)}
              {s.accepted ? "" : <span className="status status-fail">over the balance</span>}
            </div>
          ))
        ),
    },
  ];
  return (
    <DataTable
      caption="Conversion factors per batch"
      hideCaption
      rows={rows}
      rowKey={(c) => c.batchCode}
      empty="No batch has finished."
      columns={columns}
    />
  );
}

export function ClaimsTable({ rows, timeZone }: { rows: readonly ClaimRow[]; timeZone: string }) {
  const columns: Array<Column<ClaimRow>> = [
    {
      key: "shipment",
      header: "Shipment",
      cell: (c) => <HolderLink holder={{ kind: "SHIPMENT", code: c.documentNo }} showKind={false} />,
    },
    { key: "shipped", header: "Shipped", cell: (c) => <span className="nowrap">{when(c.at, timeZone)}</span> },
    { key: "customer", header: "Customer", cell: (c) => c.customer },
    { key: "set", header: "Set", cell: (c) => c.setKey },
    { key: "claimed", header: "Claimed", numeric: true, cell: (c) => kg(c.massG, 3) },
    { key: "before", header: "Credit before", numeric: true, cell: (c) => kg(c.availableG, 3) },
    {
      key: "check",
      header: "Check",
      cell: (c) =>
        c.accepted ? (
          <span className="status status-pass">within balance</span>
        ) : (
          <span className="status status-fail">exceeds by {kg(c.shortfallG, 1)}</span>
        ),
    },
  ];
  return (
    <DataTable
      caption="Certified claims on shipments"
      hideCaption
      rows={rows}
      rowKey={(c) => c.documentNo}
      empty="No shipment was claimed certified."
      columns={columns}
    />
  );
}

type Entry = AccountView["entries"][number] & { n: number };

export function RunningBalance({ a, timeZone }: { a: AccountView; timeZone: string }) {
  if (a.entries.length === 0) return null;
  const columns: Array<Column<Entry>> = [
    { key: "when", header: "When", cell: (e) => <span className="nowrap">{when(new Date(e.at), timeZone)}</span> },
    { key: "booking", header: "Booking", cell: (e) => e.description },
    { key: "change", header: "Change", numeric: true, cell: (e) => kgExact(e.deltaG) },
    { key: "balance", header: "Balance", numeric: true, cell: (e) => kgExact(e.balanceG) },
    {
      key: "check",
      header: "Check",
      cell: (e) =>
        e.accepted ? (
          <span className="muted">ok</span>
        ) : (
          <span className="status status-fail">refused, short {kgExact(e.shortfallG ?? 0)}</span>
        ),
    },
  ];
  return (
    <details className="more-rows">
      <summary>
        {a.setKey} · {a.materialLabel}: {a.entries.length} bookings, balance now {kg(a.balanceG, 3)}
      </summary>
      <DataTable
        caption={`${a.setKey} · ${a.materialLabel}`}
        hideCaption
        rows={a.entries.map((e, n) => ({ ...e, n }))}
        rowKey={(e) => `${e.bookingId ?? "end"}-${e.n}`}
        empty="No booking."
        columns={columns}
      />
    </details>
  );
}
