import "server-only";
import type { Db } from "@/lib/core/connect";
import { buildCertificate } from "@/lib/product/certificate";
import type { CertificateData } from "@/lib/product/certificate";
import { renderCertificatePdf } from "@/lib/product/certificate-pdf";
import { getSpecByKey } from "@/lib/spec/site-spec.service";
import { getProductLotDetail } from "@/lib/product/product.store";
import type { ProductLotDetail } from "@/lib/product/product.store";
import { getSiteById } from "@/lib/site/site.store";
import type { Spec } from "@/lib/spec/spec";

export interface ProductLotQc {
  detail: ProductLotDetail;
  /** null when the lot's specification key is unknown (e.g. a site specification that was removed). */
  spec: Spec | null;
  /** The judgement against the current specification, as the page and the PDF show it. */
  certificate: CertificateData | null;
}

/** A product lot with its results judged afresh against its current specification (page and certificate). */
export async function loadProductLotQc(db: Db, siteId: number, code: string, now: Date): Promise<ProductLotQc | null> {
  const [detail, site] = await Promise.all([getProductLotDetail(db, siteId, code), getSiteById(db, siteId)]);
  if (!detail || !site) return null;
  const spec = await getSpecByKey(db, siteId, detail.specKey);
  const certificate =
    spec === null
      ? null
      : buildCertificate({
          plant: { name: site.name, town: site.town },
          timeZone: site.timeZone,
          lot: { ...detail, decidedBy: detail.decidedBy },
          spec,
          results: detail.qc,
          generatedAt: now,
        });
  return { detail, spec, certificate };
}

/** The certificate of analysis as a PDF, with a file name; lots not released print "NOT RELEASED" across each page. */
export async function productCertificatePdf(
  db: Db,
  siteId: number,
  code: string,
  now: Date,
): Promise<{ filename: string; body: Uint8Array; released: boolean } | null> {
  const qc = await loadProductLotQc(db, siteId, code, now);
  if (!qc?.certificate) return null;
  const safe = code.replace(/[^A-Z0-9._-]/gi, "_");
  return {
    filename: `certificate-of-analysis-${safe}${qc.certificate.released ? "" : "-NOT-RELEASED"}.pdf`,
    body: await renderCertificatePdf(qc.certificate),
    released: qc.certificate.released,
  };
}
