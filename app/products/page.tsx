import type { Metadata } from "next";
import Link from "next/link";
import { getSpecByKey } from "@/lib/spec/site-spec.service";
import { listProductLots } from "@/lib/product/product.store";
import type { ProductLotRow } from "@/lib/product/product.store";
import { judgeRecords } from "@/lib/product/certificate";
import type { Spec } from "@/lib/spec/spec";
import { kg, when } from "@/app/_ui/format";
import { PAGE_SIZE, pageParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { CodeLink, HistoryLink, NoSite, Pager } from "@/app/_ui/ui";
import { DataTable, StatusMark } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Product lots" };

interface Row extends ProductLotRow {
  specName: string;
  missing: number;
  failing: number;
  tested: boolean;
}

function qcCell(r: Row) {
  if (r.specName === "") return <span className="muted">no specification</span>;
  if (r.failing > 0) return <StatusMark code="FAIL" label={`${r.failing} out of limits`} />;
  if (r.missing > 0)
    return <StatusMark code="MISSING" label={r.tested ? `${r.missing} missing` : `no results (${r.missing} needed)`} />;
  return <StatusMark code="PASS" label="complete, in limits" />;
}

const COLUMNS = (tz: string): Array<Column<Row>> => [
  {
    key: "code",
    header: "Product lot",
    cell: (p) => <CodeLink href={`/products/${encodeURIComponent(p.code)}`} code={p.code} />,
  },
  {
    key: "batch",
    header: "Batch",
    cell: (p) => (p.batchCode ? <Link href={`/batches/${encodeURIComponent(p.batchCode)}`}>{p.batchCode}</Link> : "—"),
  },
  { key: "produced", header: "Produced", cell: (p) => when(p.producedAt, tz) },
  { key: "mass", header: "Mass made", numeric: true, cell: (p) => kg(p.massG) },
  { key: "stock", header: "Book stock", numeric: true, cell: (p) => kg(p.stockG) },
  { key: "spec", header: "Specification", cell: (p) => p.specName || "—" },
  { key: "qc", header: "Results", cell: qcCell },
  {
    key: "status",
    header: "Release",
    cell: (p) => (
      <StatusMark
        code={p.status}
        {...(p.status === "RELEASED" && p.deviation ? { label: "Released with a deviation" } : {})}
      />
    ),
  },
  { key: "released", header: "Released", cell: (p) => when(p.releasedAt, tz) },
  {
    key: "history",
    header: "History",
    cell: (p) => <HistoryLink kind="product" recordKey={p.code} label="product lot" />,
  },
];

export default async function ProductsPage({ searchParams }: { searchParams: Promise<{ page?: string | string[] }> }) {
  const { db, site } = await loadSite();
  if (!site) return <NoSite />;
  const page = pageParam((await searchParams).page);
  const { rows, total } = await listProductLots(db, site.id, { skip: (page - 1) * PAGE_SIZE, take: PAGE_SIZE });
  const specs = new Map<string, Spec | null>();
  for (const key of new Set(rows.map((r) => r.specKey))) specs.set(key, await getSpecByKey(db, site.id, key));
  const judged: Row[] = rows.map((r) => {
    const spec = specs.get(r.specKey) ?? null;
    if (spec === null) return { ...r, specName: "", missing: 0, failing: 0, tested: r.qc.length > 0 };
    const j = judgeRecords(spec, r.qc);
    const specName = spec.siteSpec
      ? `${spec.siteSpec.name} v${spec.siteSpec.version}`
      : `${spec.edition} ${spec.grade}`;
    return { ...r, specName, missing: j.missing.length, failing: j.failing.length, tested: r.qc.length > 0 };
  });
  return (
    <>
      <h1>Product lots</h1>
      <p className="lede">
        Ester from each batch, held until its results against the chosen specification are in, then released or rejected
        by compliance. Only released lots ship.
      </p>
      <DataTable
        caption="Product lots, newest first"
        hideCaption
        columns={COLUMNS(site.timeZone)}
        rows={judged}
        rowKey={(r) => r.code}
        empty="No product lots recorded yet."
      />
      {total > 0 ? <Pager basePath="/products" page={page} total={total} pageSize={PAGE_SIZE} /> : null}
    </>
  );
}
