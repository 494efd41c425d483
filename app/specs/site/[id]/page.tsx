import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { ConfidenceMark, DataTable, RecordHeader } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { day } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { NoSite } from "@/app/_ui/ui";
import { LimitsForm } from "@/app/specs/limits-form";
import { getBuiltInSpec, limitText, sourceAnchor } from "@/lib/spec/spec";
import type { Spec, SpecProperty } from "@/lib/spec/spec";
import { resolveSiteSpec } from "@/lib/spec/site-spec.service";
import { getLatestSiteSpec, getSiteSpec, listCustomerChoices } from "@/lib/spec/site-spec.store";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Site specification" };

function columns(spec: Spec, base: Spec): Array<Column<SpecProperty>> {
  return [
    { key: "property", header: "Property", cell: (p) => p.label },
    { key: "method", header: "Test method", cell: (p) => p.method },
    { key: "limit", header: "Site limit", cell: (p) => (p.siteLimit ? <strong>{limitText(p)}</strong> : limitText(p)) },
    {
      key: "published",
      header: `${base.edition} ${base.grade}`,
      cell: (p) => limitText(base.properties.find((q) => q.key === p.key) ?? p),
    },
    {
      key: "source",
      header: "Source",
      cell: (p) => <ConfidenceMark level={p.confidence} anchor={sourceAnchor(spec.baseKey ?? spec.key, p.key)} />,
    },
  ];
}

export default async function SiteSpecPage({
  params,
  searchParams,
}: {
  params: Promise<{ id: string }>;
  searchParams: Promise<{ saved?: string | string[] }>;
}) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const id = Number((await params).id);
  if (!Number.isInteger(id) || id < 1 || id > 2_147_483_647) notFound();
  const row = await getSiteSpec(db, site.id, id);
  if (row === null) notFound();
  const spec = resolveSiteSpec(row);
  const base = getBuiltInSpec(row.baseKey);
  const [latest, customers] = await Promise.all([
    getLatestSiteSpec(db, site.id, row.name),
    listCustomerChoices(db, site.id),
  ]);
  const isLatest = latest?.version === row.version;
  const justSaved = (await searchParams).saved === "1";
  return (
    <>
      {justSaved ? (
        <p className="form-ok" role="status">
          {row.name} version {row.version} saved.
        </p>
      ) : null}
      <RecordHeader
        kind="Site specification"
        number={row.name}
        back={{ href: "/specs", label: "Specifications" }}
        facts={[
          [
            "Version",
            isLatest ? `${row.version} (current)` : `${row.version} (version ${latest?.version ?? "?"} is current)`,
          ],
          ["Copied from", base ? `${base.edition} ${base.grade}` : "an edition no longer built in"],
          ["Customer", row.customerName ?? "any"],
          ["Reason", row.reason],
          ["Written by", `${row.createdBy}, ${day(row.createdAt, site.timeZone)}`],
        ]}
      />
      {spec && base ? (
        <>
          <DataTable
            caption={`Limits of version ${row.version}`}
            columns={columns(spec, base)}
            rows={spec.properties}
            rowKey={(p) => p.key}
            empty="No properties."
          />
          {isLatest && user.role === "COMPLIANCE" ? (
            <>
              <h2>Make version {row.version + 1}</h2>
              <p>Change the limits that differ; version {row.version} stays on record as it is.</p>
              <LimitsForm
                base={base}
                start={spec}
                name={row.name}
                previousVersion={row.version}
                customerId={row.customerId}
                customers={customers}
                submitLabel={`Save as version ${row.version + 1}`}
              />
            </>
          ) : null}
        </>
      ) : (
        <p className="muted">
          The edition this was copied from is no longer built in; it cannot be used to judge lots.
        </p>
      )}
    </>
  );
}
