import type { Metadata } from "next";
import Link from "next/link";
import { CODE_PATTERN } from "@/lib/core/fields";
import { listPickupsWithContainer } from "@/lib/collect/collect.store";
import { codeParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { NoSite } from "@/app/_ui/ui";
import { DataTable } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { pickupColumns } from "@/app/pickups/pickup-columns";
import { ContainerLabel } from "@/app/labels/label-card";
import { requestOrigin } from "@/app/labels/origin";
import { PrintLabels } from "@/app/labels/print-button";

export const dynamic = "force-dynamic";
type Props = { params: Promise<{ tag: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Container ${codeParam((await params).tag)}` };
}

const SOURCE: Column<{ sourceCode: string }> = { key: "source", header: "Source", cell: (p) => p.sourceCode };

/** What a container label's QR code opens: the label itself and every pickup that listed the container. */
export default async function ContainerPage({ params }: Props) {
  const { db, site } = await loadSite();
  if (!site) return <NoSite />;
  const tag = codeParam((await params).tag)
    .trim()
    .toUpperCase();
  if (!CODE_PATTERN.test(tag)) {
    return (
      <>
        <h1>Container label</h1>
        <p className="form-error">
          {tag} is not a container number (letters, digits, &quot;.&quot;, &quot;_&quot;, &quot;/&quot;, &quot;-&quot;).
        </p>
      </>
    );
  }
  const pickups = await listPickupsWithContainer(db, site.id, tag);
  const c = pickupColumns(site.timeZone);
  return (
    <>
      <p className="crumbs labels-controls">
        <Link href="/labels">Labels</Link> /
      </p>
      <h1 className="labels-controls">Container {tag}</h1>
      <div className="labels-controls">
        <PrintLabels what="this label" />
      </div>
      <div className="label-sheet">
        <ContainerLabel tag={tag} origin={await requestOrigin()} siteName={site.name} single />
      </div>
      <h2 className="labels-controls">Pickups with this container</h2>
      <div className="labels-controls">
        <DataTable
          caption="Pickups with this container"
          hideCaption
          columns={[c.pickup, c.observed, SOURCE, c.volume, c.lot]}
          rows={pickups}
          rowKey={(p) => p.code}
          empty="No pickup has listed this container yet."
        />
      </div>
    </>
  );
}
