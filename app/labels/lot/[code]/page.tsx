import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { listLotsForLabels } from "@/lib/labels/labels.store";
import { codeParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { NoSite } from "@/app/_ui/ui";
import { LotLabel } from "@/app/labels/label-card";
import { requestOrigin } from "@/app/labels/origin";
import { PrintLabels } from "@/app/labels/print-button";

export const dynamic = "force-dynamic";
type Props = { params: Promise<{ code: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Label for lot ${codeParam((await params).code)}` };
}

export default async function LotLabelPage({ params }: Props) {
  const { db, site } = await loadSite();
  if (!site) return <NoSite />;
  const code = codeParam((await params).code);
  const [lot] = await listLotsForLabels(db, site.id, [code]);
  if (!lot) notFound();
  return (
    <>
      <p className="crumbs labels-controls">
        <Link href="/labels">Labels</Link> / <Link href={`/lots/${encodeURIComponent(code)}`}>lot {code}</Link>
      </p>
      <h1 className="labels-controls">Label for lot {code}</h1>
      <div className="labels-controls">
        <PrintLabels what="this label" />
      </div>
      <div className="label-sheet">
        <LotLabel
          lot={lot}
          origin={await requestOrigin()}
          siteName={site.name}
          timeZone={site.timeZone}
          gs1CompanyPrefix={site.gs1CompanyPrefix}
          single
        />
      </div>
    </>
  );
}
