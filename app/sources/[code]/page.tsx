import type { Metadata } from "next";
import Link from "next/link";
import { TraceThis } from "@/app/_ui/trace-this";
import { forbidden, notFound } from "next/navigation";
import { servedByCollectors } from "@/lib/source/served";
import { labelOf } from "@/lib/core/vocabulary";
import { listPickups } from "@/lib/feedstock/pickup.store";
import { listSources } from "@/lib/source/source.store";
import { day, kg, litres, when } from "@/app/_ui/format";
import { codeParam, PAGE_SIZE, pageParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { CodeLink, Empty, Facts, NoSite, Pager } from "@/app/_ui/ui";
import { SourceFfaPicture } from "@/app/sources/[code]/ffa-picture";
import { SourceChecks } from "@/app/sources/[code]/source-checks";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ code: string }>; searchParams: Promise<{ page?: string | string[] }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Source ${codeParam((await params).code)}` };
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
  return (
    <>
      <p className="crumbs">
        <Link href="/sources">Sources</Link> /
      </p>
      <h1>
        Source {source.code}: {source.name}
      </h1>
      <Facts
        items={[
          ["Kind", labelOf(source.kind)],
          ["Materials", source.materials.map(labelOf).join(", ")],
          ["Address", source.address || "—"],
          ...(collector
            ? []
            : ([
                [
                  "Certificate",
                  source.certificateNo
                    ? `${source.certificateNo}${source.certificateScheme ? ` (${source.certificateScheme})` : ""}`
                    : "none",
                ],
                ["Certificate expires", day(source.certificateExpires, tz)],
              ] as Array<[string, string]>)),
          ["Pickup every", source.pickupEveryDays === null ? "—" : `${source.pickupEveryDays} days`],
          ["Pickups recorded", String(source.pickups)],
          ["Last pickup", when(source.lastPickupAt, tz)],
        ]}
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
      {pickups.total === 0 ? (
        <Empty>No pickups recorded from this source yet.</Empty>
      ) : (
        <>
          <div className="table-wrap">
            <table>
              <thead>
                <tr>
                  <th scope="col">Pickup</th>
                  <th scope="col">Observed</th>
                  <th scope="col">Collector</th>
                  <th scope="col">Material</th>
                  <th scope="col" className="num">
                    Volume
                  </th>
                  <th scope="col" className="num">
                    Mass
                  </th>
                  <th scope="col">Lot</th>
                </tr>
              </thead>
              <tbody>
                {pickups.rows.map((p) => (
                  <tr key={p.code}>
                    <td>
                      <CodeLink href={`/pickups/${encodeURIComponent(p.code)}`} code={p.code} />
                    </td>
                    <td className="nowrap">{when(p.observedAt, tz)}</td>
                    <td>{p.collector}</td>
                    <td>{labelOf(p.material)}</td>
                    <td className="num">{litres(p.volumeMl)}</td>
                    <td className="num">{kg(p.massG)}</td>
                    <td>
                      {p.lotCode ? (
                        <CodeLink href={`/lots/${encodeURIComponent(p.lotCode)}`} code={p.lotCode} />
                      ) : (
                        <span className="muted">not yet in a lot</span>
                      )}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <Pager
            basePath={`/sources/${encodeURIComponent(source.code)}`}
            page={page}
            total={pickups.total}
            pageSize={PAGE_SIZE}
          />
        </>
      )}
    </>
  );
}
