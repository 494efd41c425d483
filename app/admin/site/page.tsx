import type { Metadata } from "next";
import { loadSite } from "@/app/_ui/site";
import { NoSite, Note } from "@/app/_ui/ui";
import { Gs1PrefixForm } from "@/app/admin/site/gs1-form";
import { gtinFor, ITEM_REFERENCES } from "@/lib/epcis/identifiers";
import { labelMaterial } from "@/lib/mass-balance/balance.service";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Site settings" };

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
        <div className="table-wrap">
          <table>
            <caption>GTINs the plant uses under its prefix (register these item references with GS1)</caption>
            <thead>
              <tr>
                <th scope="col">Material</th>
                <th scope="col">GTIN</th>
              </tr>
            </thead>
            <tbody>
              {Object.keys(ITEM_REFERENCES).map((m) => (
                <tr key={m}>
                  <td>{m === "OTHER" ? "Other material" : labelMaterial(m)}</td>
                  <td className="num">{gtinFor(prefix, m)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
      <Note>Every change is kept in the audit trail with its reason.</Note>
    </>
  );
}
