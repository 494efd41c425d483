import type { Metadata } from "next";
import { headers } from "next/headers";
import { loadSite } from "@/app/_ui/site";
import { NoSite } from "@/app/_ui/ui";
import { isTableKey } from "@/lib/grid/tables";
import { GridWorkspace } from "@/app/grid/grid-workspace";
import { pickLocale } from "@/lib/grid/locales";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Grid" };

export default async function GridPage(props: { searchParams: Promise<{ table?: string }> }) {
  const { site, user } = await loadSite();
  if (!site) return <NoSite />;
  const sp = await props.searchParams;
  const tableKey = sp.table && isTableKey(sp.table) ? sp.table : "pickups";
  const locale = pickLocale((await headers()).get("accept-language") ?? "");
  return (
    <>
      <h1>Grid</h1>
      <GridWorkspace tableKey={tableKey} role={user.role} system={user.unitSystem} locale={locale} />
    </>
  );
}
