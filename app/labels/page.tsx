import type { Metadata } from "next";
import Link from "next/link";
import { containerRange, MAX_LABELS_PER_SHEET } from "@/lib/labels/label-range";
import { listLotsForLabels, listRecentLotCodes } from "@/lib/labels/labels.store";
import { loadSite } from "@/app/_ui/site";
import { NoSite } from "@/app/_ui/ui";
import { ContainerLabel, LotLabel } from "@/app/labels/label-card";
import { requestOrigin } from "@/app/labels/origin";
import { PrintLabels } from "@/app/labels/print-button";
import { ContainerSheetForm, LotSheetForm } from "@/app/labels/sheet-forms";
import { queryValue } from "@/app/_ui/links";
import type { SearchParams } from "@/app/_ui/links";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Labels" };

const many = (v: string | string[] | undefined) => (Array.isArray(v) ? v : v ? [v] : []);

export default async function LabelsPage({ searchParams }: { searchParams: Promise<SearchParams> }) {
  const { db, site } = await loadSite();
  if (!site) return <NoSite />;
  const q = await searchParams;
  const kind = queryValue(q.kind);
  const origin = await requestOrigin();
  const recent = await listRecentLotCodes(db, site.id, 40);
  const lotCodes = many(q.lot)
    .map((c) => c.trim().toUpperCase())
    .filter(Boolean)
    .slice(0, MAX_LABELS_PER_SHEET);
  const lots = kind === "lot" && lotCodes.length ? await listLotsForLabels(db, site.id, lotCodes) : [];
  const missing = lotCodes.filter((c) => !lots.some((l) => l.code === c));
  const range =
    kind === "container"
      ? containerRange(queryValue(q.prefix) || "C-", Number(queryValue(q.from) || "1"), Number(queryValue(q.to) || "1"))
      : null;

  return (
    <>
      <h1>Labels</h1>
      <p className="lede">
        Printable labels for lots and used-oil containers. The QR code opens the record; lot labels also carry the lot
        number as a GS1 element string with application identifier (10). To read a label,{" "}
        <Link href="/labels/scan">scan it or type its number</Link>.
      </p>
      <div className="labels-controls">
        <LotSheetForm recent={recent} chosen={lotCodes} timeZone={site.timeZone} />
        <ContainerSheetForm
          prefix={queryValue(q.prefix) || "C-"}
          from={queryValue(q.from) || "1"}
          to={queryValue(q.to) || "24"}
        />
        {range && !range.ok ? (
          <p className="form-error" role="alert">
            {range.issues.map((i) => i.message).join("; ")}
          </p>
        ) : null}
        {missing.length ? (
          <p className="form-error" role="alert">
            No lot with number {missing.join(", ")} at this site.
          </p>
        ) : null}
        {lots.length || (range?.ok && range.value.length) ? <PrintLabels what="this sheet" /> : null}
      </div>
      {kind === "lot" && lots.length ? (
        <section className="label-sheet" aria-label="Lot labels">
          {lots.map((l) => (
            <LotLabel
              key={l.code}
              lot={l}
              origin={origin}
              siteName={site.name}
              timeZone={site.timeZone}
              gs1CompanyPrefix={site.gs1CompanyPrefix}
            />
          ))}
        </section>
      ) : null}
      {range?.ok ? (
        <section className="label-sheet" aria-label="Container labels">
          {range.value.map((tag) => (
            <ContainerLabel key={tag} tag={tag} origin={origin} siteName={site.name} />
          ))}
        </section>
      ) : null}
    </>
  );
}
