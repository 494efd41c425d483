import type { Metadata } from "next";
import Link from "next/link";
import { DataTable } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { day } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { NoSite } from "@/app/_ui/ui";
import { BuiltInEditions } from "@/app/specs/editions";
import { LimitsForm } from "@/app/specs/limits-form";
import { getBuiltInSpec, listBuiltInSpecs } from "@/lib/spec/spec";
import { siteLimitsText } from "@/lib/spec/site-spec";
import { listSiteSpecViews } from "@/lib/spec/site-spec.service";
import type { SiteSpecView } from "@/lib/spec/site-spec.service";
import { listCustomerChoices } from "@/lib/spec/site-spec.store";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Specifications" };

function baseText(key: string): string {
  const s = getBuiltInSpec(key);
  return s === null ? "an edition no longer built in" : `${s.edition} ${s.grade}`;
}

export default async function SpecsPage({ searchParams }: { searchParams: Promise<{ base?: string | string[] }> }) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const sp = await searchParams;
  const base = typeof sp.base === "string" ? getBuiltInSpec(sp.base) : null;
  const [views, customers] = await Promise.all([listSiteSpecViews(db, site.id), listCustomerChoices(db, site.id)]);
  const latest = new Map<string, number>();
  for (const v of views) latest.set(v.row.name, Math.max(latest.get(v.row.name) ?? 0, v.row.version));
  const columns: Array<Column<SiteSpecView>> = [
    { key: "name", header: "Name", cell: (v) => <Link href={`/specs/site/${v.row.id}`}>{v.row.name}</Link> },
    {
      key: "version",
      header: "Version",
      numeric: true,
      cell: (v) => (
        <>
          {v.row.version}
          {latest.get(v.row.name) === v.row.version ? <span className="muted"> (current)</span> : null}
        </>
      ),
    },
    { key: "base", header: "Copied from", cell: (v) => baseText(v.row.baseKey) },
    { key: "customer", header: "Customer", cell: (v) => v.row.customerName ?? <span className="muted">any</span> },
    { key: "limits", header: "Site limits", cell: (v) => (v.spec === null ? "" : siteLimitsText(v.spec)) },
    { key: "reason", header: "Reason", cell: (v) => v.row.reason },
    { key: "by", header: "Written by", cell: (v) => `${v.row.createdBy}, ${day(v.row.createdAt, site.timeZone)}` },
  ];
  const canWrite = user.role === "COMPLIANCE";
  return (
    <>
      <h1>Specifications</h1>
      <p className="lede">
        The published editions product lots are judged against, and the site&apos;s own copies with a buyer&apos;s
        tighter limits. A site copy is never changed in place: each change is a new version with its reason.
      </p>

      <h2>Site specifications</h2>
      <DataTable
        caption="Site specifications, every version"
        hideCaption
        columns={columns}
        rows={views}
        rowKey={(v) => v.row.id}
        empty="No site specifications yet. Copy a built-in grade below to make one."
      />

      <h2 id="copy">Copy a built-in grade</h2>
      {canWrite ? (
        <>
          <form method="get" action="/specs#copy" className="kit-form" aria-label="Choose the grade to copy">
            <div className="field">
              <label htmlFor="base">Copy from</label>
              <select id="base" name="base" defaultValue={base?.key ?? ""}>
                <option value="">Choose an edition and grade</option>
                {listBuiltInSpecs().map((s) => (
                  <option key={s.key} value={s.key}>
                    {s.edition} {s.grade}
                  </option>
                ))}
              </select>
            </div>
            <div className="form-actions">
              <button type="submit">Show its limits</button>
            </div>
          </form>
          {base ? <LimitsForm base={base} start={base} customers={customers} submitLabel="Save as version 1" /> : null}
        </>
      ) : (
        <p className="muted">Site specifications are written by compliance staff.</p>
      )}

      <h2>Built-in editions</h2>
      <BuiltInEditions />
    </>
  );
}
