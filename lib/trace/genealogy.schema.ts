import { z } from "zod";
import { id, when } from "@/lib/core/fields";
import { MIXING_MODELS } from "@/lib/core/vocabulary";
import { REPLAY_SNAPSHOT_FORMAT } from "@/lib/trace/replay";

/** A forward trace over more origins than this should be asked per source or per lot instead. */
export const MAX_FORWARD_ORIGINS = 100_000;

const atMs = (what: string) => when(what).transform((d) => d.getTime());

/** "What is in holder X (at time t)?" — a tank at t, a lot, a batch, a product lot. */
export const HolderTraceQuerySchema = z.object({
  holderId: id("Holder"),
  at: atMs("Trace time").optional(),
});
export type HolderTraceQuery = z.output<typeof HolderTraceQuerySchema>;

/** "What did this move carry?" — e.g. the move into a shipment. */
export const MoveTraceQuerySchema = z.object({
  moveId: id("Movement"),
});
export type MoveTraceQuery = z.output<typeof MoveTraceQuerySchema>;

/** "Where did these origins go?" — origin ids are the ids of the movements that booked the material in. */
export const ForwardTraceQuerySchema = z.object({
  originIds: z
    .array(id("Origin movement"), { error: "Origins must be a list of movement numbers" })
    .min(1, "Choose at least one origin")
    .max(MAX_FORWARD_ORIGINS, `At most ${MAX_FORWARD_ORIGINS.toLocaleString("en")} origins per forward trace`),
  at: atMs("Trace time").optional(),
});
export type ForwardTraceQuery = z.output<typeof ForwardTraceQuerySchema>;

const wholeGrams = (what: string) =>
  z
    .number({ error: `${what} (g) must be a number` })
    .int(`${what} (g) must be whole grams`)
    .positive(`${what} (g) must be more than 0`);

/** A stored replay snapshot read back from storage; restoreReplay/resumeReplay check it against the ledger. */
export const ReplaySnapshotSchema = z.object({
  format: z.literal(REPLAY_SNAPSHOT_FORMAT, { error: `Snapshot format must be ${REPLAY_SNAPSHOT_FORMAT}` }),
  applied: z.object({
    count: z.number().int().min(0, "Snapshot move count must be at least 0"),
    massSumG: z.number().int().min(0, "Snapshot mass total (g) must be at least 0"),
    last: z.object({ moveId: z.number().int(), at: z.number().finite() }).nullable(),
  }),
  holders: z.array(
    z.object({
      holderId: z.number().int(),
      mixing: z.enum(MIXING_MODELS, { error: `Mixing must be one of: ${MIXING_MODELS.join(", ")}` }),
      layers: z.array(
        z.object({
          enteredByMoveId: z.number().int(),
          originIds: z.array(z.number().int()),
          grams: z.array(wholeGrams("Layer grams")),
        }),
      ),
    }),
  ),
  leftOut: z.array(z.number().int()).optional(),
});
