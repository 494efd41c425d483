import type { Metadata } from "next";
import Link from "next/link";
import { getActiveWasteRules } from "@/lib/waste/site-rules.store";
import { wasteDefaults } from "@/app/references/default-sources";
import { when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { NoSite, Note } from "@/app/_ui/ui";
import { ConfidenceMark } from "@/app/_ui/kit";
import { WasteRulesForm } from "@/app/waste/rules/rules-form";
import { TableHead } from "@/app/_ui/kit/table-head";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Waste rule set" };

const CATEGORY_WORDS: Readonly<Record<string, string>> = {
  LQG: "large quantity generator",
  SQG: "small quantity generator",
  VSQG: "very small quantity generator",
};

export default async function WasteRulesPage() {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const active = await getActiveWasteRules(db, site.id);
  const group = wasteDefaults(active.rules);
  const canChoose = user.role === "ADMIN" || user.role === "COMPLIANCE";
  return (
    <>
      <p className="crumbs">
        <Link href="/waste">Waste</Link> /
      </p>
      <h1>Waste rule set</h1>
      <p className="lede">
        The accumulation and storage limits the waste-due list, the container pages and the reports work to. Federal
        rules are the starting point; states and other countries differ, so a site can name its own set.
      </p>
      <section aria-labelledby="active-h">
        <h2 id="active-h">In force</h2>
        <p>
          <strong>{active.rules.name}</strong>, {CATEGORY_WORDS[active.generatorCategory] ?? active.generatorCategory}
          {active.tsdfDistanceMiles === null ? "" : `, treatment facility ${active.tsdfDistanceMiles} miles away`}.
        </p>
        {active.chosen ? (
          <p>
            Chosen {when(active.chosen.at, site.timeZone)} by {active.chosen.by}: {active.chosen.reason}
          </p>
        ) : (
          <Note>
            No rule set chosen for this site yet: the pages assume federal rules for a large quantity generator, the
            shortest federal accumulation time.
          </Note>
        )}
        <div className="table-wrap">
          <table>
            <caption>Limits in force</caption>
            <TableHead headings={["Limit", "Value", "Source", "Reliance"]} />
            <tbody>
              {group.entries.map((e) => (
                <tr key={e.anchor}>
                  <td>{e.label}</td>
                  <td>{e.value}</td>
                  <td>{e.source}</td>
                  <td>
                    <ConfidenceMark level={e.level} anchor={e.anchor} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <Note>{active.rules.localRulesNote}</Note>
      </section>
      {canChoose ? (
        <section aria-labelledby="choose-h">
          <h2 id="choose-h">Choose the rule set</h2>
          <WasteRulesForm
            current={{
              choice: active.rules.id === "SITE_OWN" ? "SITE_OWN" : "US_FEDERAL",
              generatorCategory: active.generatorCategory,
            }}
          />
        </section>
      ) : (
        <Note>An administrator or compliance officer chooses the rule set.</Note>
      )}
    </>
  );
}
