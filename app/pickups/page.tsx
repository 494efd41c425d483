import type { Metadata } from "next";
import { listPickups } from "@/lib/feedstock/pickup.store";
import { PAGE_SIZE, pageParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { DataTable } from "@/app/_ui/kit";
import { Empty, NoSite, Pager } from "@/app/_ui/ui";
import { pickupColumns } from "@/app/pickups/pickup-columns";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Pickups" };

export default async function PickupsPage({ searchParams }: { searchParams: Promise<{ page?: string | string[] }> }) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const page = pageParam((await searchParams).page);
  // A collector sees their own entries; everyone else the whole site.
  const own = user.role === "COLLECTOR";
  const { rows, total } = await listPickups(db, site.id, {
    skip: (page - 1) * PAGE_SIZE,
    take: PAGE_SIZE,
    ...(own ? { collectorId: user.userId } : {}),
  });
  const c = pickupColumns(site.timeZone);
  return (
    <>
      <h1>Pickups</h1>
      <p className="lede">
        {own ? "Your pickups" : "Each collection of oil at a source"} as the collector observed it, newest first. Masses
        are estimated from volume and temperature until the lot is measured at the plant.
      </p>
      {total === 0 ? (
        <Empty>No pickups recorded yet.</Empty>
      ) : (
        <>
          <Pager basePath="/pickups" page={page} total={total} pageSize={PAGE_SIZE} />
          <DataTable
            caption={own ? "Pickups you recorded" : "Pickups"}
            hideCaption
            cards
            columns={[
              c.pickup,
              c.observed,
              c.source,
              c.collector,
              c.material,
              c.containers,
              c.volume,
              c.temp,
              c.mass,
              c.lot,
              c.history,
            ]}
            rows={rows}
            rowKey={(p) => p.code}
            empty="No pickups recorded yet."
          />
          <Pager basePath="/pickups" page={page} total={total} pageSize={PAGE_SIZE} />
        </>
      )}
    </>
  );
}
