import type { Metadata } from "next";
import Link from "next/link";
import { proposeBatchPlan } from "@/lib/batch/plan.service";
import { when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { NoSite } from "@/app/_ui/ui";
import { RecipeCardView } from "@/app/plan/recipe-card";
import { getSiteLimits } from "@/lib/mass-balance/site-limits.service";
import { PrintButton } from "@/app/plan/print-button";
import { firstParam, planQueryString, planRequestFromParams } from "@/app/plan/plan-query";
import type { SearchParams } from "@/app/plan/plan-query";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Recipe card" };

/** The card alone, for printing: the same query as the planning page, proposed again from the stock now. */
export default async function RecipeCardPage({ searchParams }: { searchParams: Promise<SearchParams> }) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const params = await searchParams;
  const query = planQueryString(params);
  const back = (
    <p className="crumbs no-print">
      <Link href={`/plan?${query}`}>Back to the plan</Link>
    </p>
  );
  if (firstParam(params, "targetOilKg") === "") {
    return (
      <div className="recipe-card-page">
        {back}
        <h1>Recipe card</h1>
        <p>Plan a batch first; the card is printed from the plan&apos;s settings.</p>
      </div>
    );
  }
  const proposal = await proposeBatchPlan(
    db,
    { siteId: site.id, userId: user.userId, now: user.now },
    planRequestFromParams(params),
  );
  const issues = proposal.ok ? (proposal.value.outcome.ok ? [] : proposal.value.outcome.issues) : proposal.issues;
  return (
    <div className="recipe-card-page">
      {back}
      <h1 className="no-print">Recipe card</h1>
      {proposal.ok && proposal.value.outcome.ok ? (
        <>
          <PrintButton />
          <RecipeCardView
            card={proposal.value.outcome.card}
            heading={`${site.name} — recipe card`}
            printedAt={when(user.now, site.timeZone)}
            waterLimit={(await getSiteLimits(db, site.id)).water.BASE_STEP}
          />
        </>
      ) : (
        <ul>
          {issues.map((i, n) => (
            <li key={`${i.code}-${n}`} className="form-error">
              {i.message}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
