import type { Metadata } from "next";
import Link from "next/link";
import { TraceThis } from "@/app/_ui/trace-this";
import { notFound } from "next/navigation";
import { labelOf } from "@/lib/core/vocabulary";
import { getBatchDetail } from "@/lib/batch/batch.store";
import { getMadeOf } from "@/lib/feedstock/lot-flow.service";
import { kg, num, when } from "@/app/_ui/format";
import { codeParam } from "@/app/_ui/links";
import { MadeOf } from "@/app/_ui/made-of";
import { loadSite } from "@/app/_ui/site";
import { Facts, NoSite, Note, Status } from "@/app/_ui/ui";
import { BatchPlanSection } from "@/app/batches/[code]/batch-plan-section";
import { summarizeBatchClosure } from "@/lib/batch/closure";
import { getSiteLimits } from "@/lib/mass-balance/site-limits.service";
import { ChargesSection, ClosureSection, OutputsSection, ProductLotsTable } from "@/app/batches/[code]/batch-sections";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ code: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Batch ${codeParam((await params).code)}` };
}

function prettyRecipe(json: string): string | null {
  try {
    const value: unknown = JSON.parse(json);
    if (value === null || (typeof value === "object" && Object.keys(value).length === 0)) return null;
    return JSON.stringify(value, null, 2);
  } catch {
    return json;
  }
}

export default async function BatchPage({ params }: Props) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const b = await getBatchDetail(db, site.id, codeParam((await params).code));
  if (!b) notFound();
  const madeOf =
    b.charges.length > 0
      ? await getMadeOf(db, site.id, b.holderId, new Date())
      : { totalG: 0, shares: [], feedstockG: 0, reagents: [], order: "dated" as const };
  const tz = site.timeZone;
  const chargedG = b.charges.reduce((s, m) => s + m.massG, 0);
  const outG = b.outputs.reduce((s, m) => s + m.massG, 0);
  const tolerance = (await getSiteLimits(db, site.id)).closure;
  const closure = summarizeBatchClosure(
    [
      ...b.charges.map((m) => ({ role: m.role, massG: m.massG, direction: "IN" as const })),
      ...b.outputs.map((m) => ({ role: m.role, massG: m.massG, direction: "OUT" as const })),
      ...b.unmeasured.map((m) => ({
        role: m.role,
        massG: m.massG,
        direction: m.to.id === b.holderId ? ("IN" as const) : ("OUT" as const),
      })),
    ],
    tolerance,
  );
  const finished = b.status === "COMPLETE";
  const recipe = prettyRecipe(b.recipeJson);
  return (
    <>
      <p className="crumbs">
        <Link href="/batches">Batches</Link> /
      </p>
      <h1>Batch {b.code}</h1>
      <Facts
        items={[
          ["Status", <Status key="s" code={b.status} />],
          ["Planned", when(b.plannedAt, tz)],
          ["Started", when(b.startedAt, tz)],
          ["Finished", when(b.completedAt, tz)],
          ["Target oil", kg(b.targetOilG)],
          ["Methanol : oil molar ratio", `${num(b.molarRatio, 1)} : 1`],
          ["Catalyst", labelOf(b.catalyst)],
          ["Reaction temperature", `${num(b.reactionTempC, 1)} °C`],
          ["Acid pretreatment", b.pretreated ? "Yes" : "No"],
          ["Charged", kg(chargedG, 3)],
          ["Out", kg(outG, 3)],
          ...(finished ? [] : ([["Still in the reactor", kg(b.stockG, 3)]] as Array<[string, string]>)),
        ]}
      />
      <TraceThis kind="BATCH" code={b.code} role={user.role} back />
      {b.notes ? <p>Notes: {b.notes}</p> : null}
      <BatchPlanSection batch={b} />

      <ChargesSection b={b} tz={tz} />

      <h2>Feedstock and reagent lots in this batch</h2>
      <MadeOf madeOf={madeOf} what="batch" />

      <OutputsSection b={b} tz={tz} />

      {finished ? (
        <ClosureSection b={b} closure={closure} tolerance={tolerance} canCorrect={user.role === "PRODUCTION"} />
      ) : null}

      <h2>Product lots</h2>
      <ProductLotsTable products={b.products} />

      {recipe ? (
        <>
          <h2>Recipe as planned</h2>
          <details>
            <summary>Show the stored recipe</summary>
            <pre className="recipe">{recipe}</pre>
          </details>
          <Note>The recipe is the plan; the charges above are what was actually put in.</Note>
        </>
      ) : null}
    </>
  );
}
