import type { Metadata } from "next";
import { labelOf } from "@/lib/core/vocabulary";
import { listLots } from "@/lib/feedstock/lot.store";
import { daysBetween, ffa, kg, pct, when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { CodeLink, Empty, NoSite, Note } from "@/app/_ui/ui";
import type { Column } from "@/app/_ui/kit";
import { DataTable } from "@/app/_ui/kit";
import { LabCautions } from "@/app/lab/lab-cautions";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Lab" };

type LabRow = Awaited<ReturnType<typeof listLots>>["rows"][number];

const labColumns = (tz: string, now: Date): Column<LabRow>[] => [
  { key: "lot", header: "Lot", cell: (l) => <CodeLink href={`/lab/${encodeURIComponent(l.code)}`} code={l.code} /> },
  { key: "material", header: "Material", cell: (l) => labelOf(l.material) },
  { key: "received", header: "Received", cell: (l) => <span className="nowrap">{when(l.receivedAt, tz)}</span> },
  { key: "waiting", header: "Waiting", numeric: true, cell: (l) => `${Math.max(0, daysBetween(l.receivedAt, now))} d` },
  { key: "mass", header: "Mass", numeric: true, cell: (l) => kg(l.massG) },
  { key: "ffa", header: "FFA so far", numeric: true, cell: (l) => ffa(l.ffaPct, l.ffaBasis) },
  { key: "water", header: "Water so far", numeric: true, cell: (l) => (l.waterPct === null ? "—" : pct(l.waterPct)) },
  { key: "source", header: "Source", cell: (l) => l.supplier ?? `${l.pickups} pickup${l.pickups === 1 ? "" : "s"}` },
];

export default async function LabPage() {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const { rows, total } = await listLots(db, site.id, { status: "QUARANTINED", take: 200 });
  const tz = site.timeZone;
  const now = user.now;
  return (
    <>
      <h1>Lab</h1>
      <p className="lede">
        Lots waiting for the lab. Titrate for free fatty acids, test the water, then accept the lot for production or
        reject it. A lot can only be accepted once it has an FFA titration.
      </p>
      {user.role !== "PRODUCTION" ? <Note>Production staff record lab results; you can read them.</Note> : null}
      <LabCautions kind="titration" />
      {total === 0 ? (
        <Empty>No lot is waiting for the lab.</Empty>
      ) : (
        <DataTable
          caption={total === 1 ? "1 lot awaiting the lab" : `${total} lots awaiting the lab`}
          columns={labColumns(tz, now)}
          rows={rows}
          rowKey={(l) => l.code}
          empty="No lot is waiting for the lab."
        />
      )}
    </>
  );
}
