import type { Metadata } from "next";
import type { DomainIssue, Result } from "@/lib/core/result";
import type { PlanProposal } from "@/lib/batch/plan";
import { DEFAULT_COST_PER_KG, blendWaterLimit, buildCandidates } from "@/lib/batch/plan";
import { loadPlanStock } from "@/lib/batch/plan.store";
import { proposeBatchPlan } from "@/lib/batch/plan.service";
import { listBatches } from "@/lib/batch/batch.store";
import { getSiteLimits } from "@/lib/mass-balance/site-limits.service";
import { when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { NoSite, Note } from "@/app/_ui/ui";
import { toFormErrors } from "@/app/_ui/kit/form-state";
import { CandidatesTable } from "@/app/plan/candidates-table";
import { Refusal } from "@/app/plan/refusal";
import { ProposedDraws } from "@/app/plan/proposed-draws";
import { AcidSettings, BlendFieldset, PlanCautions, RecipeFieldset } from "@/app/plan/plan-fieldsets";
import {
  PLAN_NUMBER_FIELDS,
  PLAN_TEXT_FIELDS,
  firstParam,
  planQueryString,
  planRequestFromParams,
} from "@/app/plan/plan-query";
import type { SearchParams } from "@/app/plan/plan-query";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Plan a batch" };

const KNOWN_FIELDS: string[] = [...PLAN_NUMBER_FIELDS, ...PLAN_TEXT_FIELDS];

function nextBatchCode(latest: string | undefined): string {
  const m = latest ? /^(.*?)(\d+)$/.exec(latest) : null;
  if (!m || m[1] === undefined || m[2] === undefined) return "B-0001";
  return `${m[1]}${String(Number(m[2]) + 1).padStart(m[2].length, "0")}`;
}

function issuesOf(proposal: Result<PlanProposal> | null): DomainIssue[] {
  if (proposal === null) return [];
  if (!proposal.ok) return proposal.issues;
  return proposal.value.outcome.ok ? [] : proposal.value.outcome.issues;
}

export default async function PlanPage({ searchParams }: { searchParams: Promise<SearchParams> }) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const params = await searchParams;
  // Any query means the form was sent: a missing target is then an error next to its field.
  const asked = Object.keys(params).length > 0;
  const actor = { siteId: site.id, userId: user.userId, now: user.now };
  const proposal = asked ? await proposeBatchPlan(db, actor, planRequestFromParams(params)) : null;
  const candidates = proposal?.ok
    ? proposal.value.candidates
    : buildCandidates(
        await loadPlanStock(db, site.id),
        { costs: {}, defaultCostPerKg: DEFAULT_COST_PER_KG.value, exclude: [] },
        user.now,
      );
  const issues = issuesOf(proposal);
  const { errors, general } = toFormErrors(issues, [...KNOWN_FIELDS, ...candidates.map((c) => `costs.${c.ref}`)]);
  const outcome = proposal?.ok ? proposal.value.outcome : null;
  const drawn = new Map(outcome?.ok ? outcome.blend.draws.map((d) => [d.ref, d.massG]) : []);
  const query = planQueryString(params);
  const latest = (await listBatches(db, site.id, { take: 1 })).rows[0]?.code;
  const catalyst = firstParam(params, "catalyst") || "KOH";
  const objective = firstParam(params, "objective") || "OLDEST_FIRST";
  const canWrite = user.role === "PRODUCTION";
  const limits = await getSiteLimits(db, site.id);

  return (
    <>
      <h1>Plan a batch</h1>
      <p className="lede">
        Say how much oil the batch takes and the blend limits; the planner proposes what to draw from accepted lots and
        feedstock tanks, then works out the recipe for that blend — with acid pretreatment when its FFA needs it — as a
        printable card.
      </p>
      {!canWrite ? <Note>Anyone can work out a plan here; only production staff can record it.</Note> : null}
      <PlanCautions />

      <form method="get" action="/plan" className="plan-form" noValidate aria-label="Plan settings">
        <BlendFieldset params={params} errors={errors} objective={objective} water={limits.water} />
        <RecipeFieldset params={params} errors={errors} catalyst={catalyst} />
        <AcidSettings params={params} errors={errors} />
        <CandidatesTable candidates={candidates} params={params} errors={errors} drawn={drawn} />
        <Note>
          FFA is shown as oleic for every candidate so that lots titrated as palmitic or lauric compare and blend by
          their moles of acid. A tank&apos;s FFA and water are the mass-weighted means of the lab results of the lots it
          holds now, traced through the movement ledger. Costs are optional: the books hold no prices, so every
          candidate costs {DEFAULT_COST_PER_KG.value} per kg unless you enter one.
        </Note>
        {proposal !== null && !proposal.ok ? (
          <p className="form-error" role="alert">
            {general.length > 0 ? general.join(" ") : "Not planned: check the marked fields."}
          </p>
        ) : null}
        <button type="submit" className="primary">
          Propose draws and recipe
        </button>
      </form>

      {proposal?.ok ? (
        <Refusal
          proposal={proposal.value}
          waterLimitPct={blendWaterLimit(proposal.value.request, limits.water).value}
        />
      ) : null}

      {outcome?.ok ? (
        <ProposedDraws
          outcome={outcome}
          query={query}
          printedAt={when(user.now, site.timeZone)}
          canWrite={canWrite}
          suggestedCode={nextBatchCode(latest)}
          baseWaterLimit={limits.water.BASE_STEP}
        />
      ) : null}
    </>
  );
}
