// Lab results and batch planning: the computations as JSON endpoints and their documentation. The schemas
// (lab-schemas.ts) and pure answers (lab-answers.ts) are re-exported for the route handlers.
import { z } from "zod";
import type { EndpointDoc } from "@/lib/api/openapi";
import { TitrationEntrySchema } from "@/lib/titration/titration.schema";
import { BlendRequestSchema } from "@/lib/blend/blend.schema";
import { PretreatmentInputSchema, RecipeInputSchema } from "@/lib/recipe/recipe.schema";
import { BatchPlanRequestSchema } from "@/lib/batch/plan";
import { LabTestSchema, LotDecisionSchema } from "@/lib/feedstock/lot.schema";
import { BatchCompleteSchema, BatchStartSchema } from "@/lib/batch/batch.schema";
// eslint-disable-next-line no-restricted-imports -- LotTitrationSchema is defined in the service file; documentation needs the same schema (move it to a schema file)
import { LotTitrationSchema } from "@/lib/feedstock/titration.service";
import {
  AcidValueFfaAnswerSchema,
  AcidValueFfaRequestSchema,
  BatchYieldQuerySchema,
  SampleSizeAnswerSchema,
  SampleSizeQuerySchema,
  TitrationAnswerSchema,
  VolumeMassAnswerSchema,
  VolumeMassRequestSchema,
  YieldRequestSchema,
} from "@/lib/api/endpoints/lab-schemas";
export * from "@/lib/api/endpoints/lab-schemas";
import {
  BatchYieldOutputSchema,
  BlendPlanOutputSchema,
  PretreatmentPlanOutputSchema,
  ProposalOutputSchema,
  RecipeCardOutputSchema,
  RecipePlanOutputSchema,
} from "@/lib/api/endpoints/lab-schemas";
export * from "@/lib/api/endpoints/lab-answers";

// ---- documentation ------------------------------------------------------------------------------

const TAG_LAB = "Lab";
const TAG_COMPUTE = "Computations";
const TAG_BATCH = "Batches";

const WriteOk = z.object({ id: z.number().int() });

/** Lab results and batch planning endpoints. */
export const LAB_ENDPOINTS: EndpointDoc[] = [
  {
    method: "post",
    path: "/api/compute/titration",
    summary:
      "FFA % (AOCS Ca 5a-40) and acid value (EN 14104 form) from one titration; nothing is stored. Any signed-in user.",
    tag: TAG_COMPUTE,
    input: TitrationEntrySchema,
    output: TitrationAnswerSchema,
  },
  {
    method: "post",
    path: "/api/compute/acid-value-ffa",
    summary:
      "Acid value ↔ FFA % conversion (molar-mass ratio, or the Ca 5a-40 ×1.99 note for oleic). Any signed-in user.",
    tag: TAG_COMPUTE,
    input: AcidValueFfaRequestSchema,
    output: AcidValueFfaAnswerSchema,
  },
  {
    method: "get",
    path: "/api/compute/sample-size",
    summary:
      "Sample mass, alcohol volume and titrant strength for an expected FFA (AOCS Ca 5a-40 Table 1). Any signed-in user.",
    tag: TAG_COMPUTE,
    input: SampleSizeQuerySchema,
    output: SampleSizeAnswerSchema,
  },
  {
    method: "post",
    path: "/api/compute/volume-mass",
    summary:
      "Observed volume → mass and standard volume at 15 °C or 60 °F, or mass → volumes; density from the table or a measured value. Any signed-in user.",
    tag: TAG_COMPUTE,
    input: VolumeMassRequestSchema,
    output: VolumeMassAnswerSchema,
  },
  {
    method: "post",
    path: "/api/compute/recipe",
    summary:
      "Base-catalysed batch recipe for the lots to charge: methanol, catalyst corrected for purity, expected products. Any signed-in user.",
    tag: TAG_COMPUTE,
    input: RecipeInputSchema,
    output: RecipePlanOutputSchema,
  },
  {
    method: "post",
    path: "/api/compute/pretreatment",
    summary:
      "Route by blend FFA, and the acid esterification step plus base step when the FFA needs it. Any signed-in user.",
    tag: TAG_COMPUTE,
    input: PretreatmentInputSchema,
    output: PretreatmentPlanOutputSchema,
  },
  {
    method: "post",
    path: "/api/compute/blend",
    summary:
      "Draws from candidate lots that make the target within the FFA and water limits (HiGHS); when impossible, which limit fails and by how much. Any signed-in user.",
    tag: TAG_COMPUTE,
    input: BlendRequestSchema,
    output: BlendPlanOutputSchema,
  },
  {
    method: "post",
    path: "/api/compute/yield",
    summary:
      "Ester yield vs theory and per kg oil, glycerol phase per kg oil, catalyst and methanol used vs planned. Any signed-in user.",
    tag: TAG_COMPUTE,
    input: YieldRequestSchema,
    output: BatchYieldOutputSchema,
  },
  {
    method: "post",
    path: "/api/lab/titrations",
    summary: "Records a titration for a lot; FFA % and acid value are computed on the server. Production.",
    tag: TAG_LAB,
    input: LotTitrationSchema,
    output: z.object({ id: z.number().int(), ffaPct: z.number(), acidValue: z.number() }),
  },
  {
    method: "post",
    path: "/api/lab/tests",
    summary: "Records a water, insolubles or unsaponifiables result for a lot. Production.",
    tag: TAG_LAB,
    input: LabTestSchema,
    output: WriteOk,
  },
  {
    method: "post",
    path: "/api/lab/decisions",
    summary: "Accepts a lot for production (needs an FFA titration) or rejects it. Production.",
    tag: TAG_LAB,
    input: LotDecisionSchema,
    output: z.object({ code: z.string(), status: z.string() }),
  },
  {
    method: "post",
    path: "/api/batches/propose",
    summary:
      "Proposes draws from accepted lots and feedstock tanks and the recipe card; nothing is stored. Any signed-in user.",
    tag: TAG_BATCH,
    input: BatchPlanRequestSchema,
    output: ProposalOutputSchema,
  },
  {
    method: "post",
    path: "/api/batches/plan",
    summary:
      "Proposes as /api/batches/propose and records the batch as planned, storing the recipe card and draws (code required). Production.",
    tag: TAG_BATCH,
    input: BatchPlanRequestSchema,
    output: z.object({ code: z.string(), card: RecipeCardOutputSchema }),
  },
  {
    method: "post",
    path: "/api/batches/start",
    summary: "Records what went into the reactor; every draw is guarded against over-drawing. Production.",
    tag: TAG_BATCH,
    input: BatchStartSchema,
    output: z.object({ code: z.string(), chargedG: z.number().int() }),
  },
  {
    method: "post",
    path: "/api/batches/complete",
    summary:
      "Records what was weighed or gauged out; the remainder is booked as the batch's unmeasured difference (never typed). Water used for washing goes from its water lot to the wash-water stream. Production.",
    tag: TAG_BATCH,
    input: BatchCompleteSchema,
    output: z.object({ code: z.string(), productLots: z.array(z.string()), unmeasuredG: z.number().int() }),
  },
  {
    method: "get",
    path: "/api/batches/yield",
    summary: "Computed yield of a recorded batch against its plan. Any signed-in user.",
    tag: TAG_BATCH,
    input: BatchYieldQuerySchema,
    output: z.object({ basis: z.enum(["card", "legacy"]), notes: z.array(z.string()), yield: BatchYieldOutputSchema }),
  },
];
