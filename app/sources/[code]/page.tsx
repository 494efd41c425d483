import type { Metadata } from "next";
import { TraceThis } from "@/app/_ui/trace-this";
import { forbidden, notFound } from "next/navigation";
import { servedByCollectors } from "@/lib/source/served";
import { labelOf } from "@/lib/core/vocabulary";
import { listPickups } from "@/lib/feedstock/pickup.store";
import { listSources } from "@/lib/source/source.store";
import { day, when } from "@/app/_ui/format";
import { codeParam, PAGE_SIZE, pageParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { NoSite, Pager } from "@/app/_ui/ui";
import { DataTable, RecordHeader } from "@/app/_ui/kit";
import { pickupColumns } from "@/app/pickups/pickup-columns";
import { SourceFfaPicture } from "@/app/sources/[code]/ffa-picture";
import { SourceChecks } from "@/app/sources/[code]/source-checks";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ code: string }>; searchParams: Promise<{ page?: string | string[] }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Source ${codeParam((await params).code)}` };
}

type Source = Awaited<ReturnType<typeof listSources>>[number];

function sourceFacts(source: Source, collector: boolean, tz: string): Array<readonly [string, string]> {
  // A collector sees where and when to collect, not the certificate.
  const certificate: Array<readonly [string, string]> = collector
    ? []
    : [
        [
          "Certificate",
          source.certificateNo
            ? `${source.certificateNo}${source.certificateScheme ? ` (${source.certificateScheme})` : ""}`
            : "none",
        ],
        ["Certificate expires", day(source.certificateExpires, tz)],
      ];
  return [
    ["Kind", labelOf(source.kind)],
    ["Materials", source.materials.map(labelOf).join(", ")],
    ["Address", source.address || "—"],
    ...certificate,
    ["Pickup every", source.pickupEveryDays === null ? "—" : `${source.pickupEveryDays} days`],
    ["Pickups recorded", String(source.pickups)],
    ["Last pickup", when(source.lastPickupAt, tz)],
  ];
}

export default async function SourcePage({ params, searchParams }: Props) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const code = codeParam((await params).code);
  const page = pageParam((await searchParams).page);
  const source = (await listSources(db, site.id)).find((s) => s.code === code);
  if (!source) notFound();
  const collector = user.role === "COLLECTOR";
  if (collector && !servedByCollectors(source)) forbidden();
  const pickups = await listPickups(db, site.id, {
    sourceId: source.id,
    skip: (page - 1) * PAGE_SIZE,
    take: PAGE_SIZE,
  });
  const tz = site.timeZone;
  const c = pickupColumns(tz);
  return (
    <>
      <RecordHeader
        kind="Source"
        number={source.code}
        name={source.name}
        back={{ href: "/sources", label: "Sources" }}
        facts={sourceFacts(source, collector, tz)}
      />
      {collector ? null : <SourceFfaPicture db={db} siteId={site.id} source={source} timeZone={tz} />}
      {collector || user.role === "PRODUCTION" ? null : (
        <SourceChecks
          db={db}
          siteId={site.id}
          sourceId={source.id}
          code={source.code}
          timeZone={tz}
          compliance={user.role === "COMPLIANCE"}
        />
      )}
      <TraceThis kind="SOURCE" code={source.code} role={user.role} />
      <h2>Pickups from this source</h2>
      <DataTable
        caption="Pickups from this source"
        hideCaption
        columns={[c.pickup, c.observed, c.collector, c.material, c.volume, c.mass, c.lot]}
        rows={pickups.rows}
        rowKey={(p) => p.code}
        empty="No pickups recorded from this source yet."
      />
      <Pager
        basePath={`/sources/${encodeURIComponent(source.code)}`}
        page={page}
        total={pickups.total}
        pageSize={PAGE_SIZE}
      />
    </>
  );
}
