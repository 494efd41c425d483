import type { Metadata } from "next";
import { labelOf } from "@/lib/core/vocabulary";
import { listSources } from "@/lib/source/source.store";
import type { SourceRow } from "@/lib/source/source.store";
import { servedByCollectors } from "@/lib/source/served";
import { day } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { CodeLink, HistoryLink, NoSite } from "@/app/_ui/ui";
import { DataTable } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Sources" };

export default async function SourcesPage() {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const collector = user.role === "COLLECTOR";
  const all = await listSources(db, site.id);
  // Collectors see the route's sources; certificates stay with the office.
  const rows = collector ? all.filter(servedByCollectors) : all;
  const now = user.now;
  const tz = site.timeZone;
  const columns: Array<Column<SourceRow>> = [
    {
      key: "code",
      header: "Code",
      cell: (s) => <CodeLink href={`/sources/${encodeURIComponent(s.code)}`} code={s.code} />,
    },
    { key: "name", header: "Name", cell: (s) => s.name },
    { key: "kind", header: "Kind", cell: (s) => labelOf(s.kind) },
    { key: "materials", header: "Materials", cell: (s) => s.materials.map(labelOf).join(", ") },
    ...(collector
      ? []
      : [
          {
            key: "certificate",
            header: "Certificate",
            cell: (s: SourceRow) =>
              s.certificateNo ? (
                <>
                  {s.certificateNo}{" "}
                  {s.certificateExpires && s.certificateExpires < now ? (
                    <span className="status status-fail">expired {day(s.certificateExpires, tz)}</span>
                  ) : (
                    <span className="muted">to {day(s.certificateExpires, tz)}</span>
                  )}
                </>
              ) : (
                <span className="muted">none</span>
              ),
          },
        ]),
    {
      key: "every",
      header: "Pickup every",
      numeric: true,
      cell: (s) => (s.pickupEveryDays === null ? "—" : `${s.pickupEveryDays} d`),
    },
    { key: "pickups", header: "Pickups", numeric: true, cell: (s) => s.pickups },
    { key: "last", header: "Last pickup", cell: (s) => <span className="nowrap">{day(s.lastPickupAt, tz)}</span> },
    { key: "history", header: "History", cell: (s) => <HistoryLink kind="source" recordKey={s.code} label="source" /> },
  ];
  return (
    <>
      <h1>Sources</h1>
      <p className="lede">
        {collector
          ? "The places on the collection route."
          : "Restaurants, food processors, renderers, crushers and other suppliers the plant collects from or buys from."}
      </p>
      <DataTable
        caption="Sources"
        hideCaption
        columns={columns}
        rows={rows}
        rowKey={(s) => s.code}
        empty="No sources recorded yet."
      />
    </>
  );
}
