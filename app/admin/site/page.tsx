import type { Metadata } from "next";
import { loadSite } from "@/app/_ui/site";
import { NoSite, Note } from "@/app/_ui/ui";
import { DataTable } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { Gs1PrefixForm } from "@/app/admin/site/gs1-form";
import { gtinFor, ITEM_REFERENCES } from "@/lib/epcis/identifiers";
import { labelMaterial } from "@/lib/mass-balance/balance.service";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Site settings" };

function gtinColumns(prefix: string): Array<Column<string>> {
  return [
    { key: "material", header: "Material", cell: (m) => (m === "OTHER" ? "Other material" : labelMaterial(m)) },
    { key: "gtin", header: "GTIN", numeric: true, cell: (m) => gtinFor(prefix, m) },
  ];
}

export default async function SiteSettingsPage() {
  const { site, user } = await loadSite();
  if (!site) return <NoSite />;
  if (user.role !== "ADMIN") {
    return (
      <>
        <h1>Site settings</h1>
        <p className="form-error" role="alert">
          Only an administrator changes the site settings.
        </p>
      </>
    );
  }
  const prefix = site.gs1CompanyPrefix;
  return (
    <>
      <h1>Site settings</h1>
      <h2>GS1 identifiers</h2>
      <p className="lede">
        {prefix === null
          ? "The plant has no GS1 Company Prefix on file. Lot labels carry the lot number alone, and EPCIS exports name lots, tanks and the plant with this site's own web addresses."
          : `GS1 Company Prefix ${prefix}: lot labels carry the material's GTIN with the lot number, and EPCIS exports name lots by GTIN and lot, the plant and its tanks by GLN.`}
      </p>
      <Gs1PrefixForm current={prefix} />
      {prefix !== null ? (
        <DataTable
          caption="GTINs the plant uses under its prefix (register these item references with GS1)"
          columns={gtinColumns(prefix)}
          rows={Object.keys(ITEM_REFERENCES)}
          rowKey={(m) => m}
          empty="No materials."
        />
      ) : null}
      <Note>Every change is kept in the audit trail with its reason.</Note>
    </>
  );
}
