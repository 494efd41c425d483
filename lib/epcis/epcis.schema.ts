import { z } from "zod";
import { code, oneOf, when } from "@/lib/core/fields";
import { BACKWARD_KINDS, FORWARD_KINDS } from "@/lib/trace/trace-query.schema";

/** Query strings send "" for an empty field. */
const blank = (v: unknown) => (v === "" || v === null ? undefined : v);

export const TRACE_DIRECTIONS = ["back", "fwd"] as const;

/**
 * GET /api/epcis/trace: the events behind one trace answer — backward (dir=back: what is in a product
 * lot, tank, shipment or batch) or forward (dir=fwd: where a source's, pickup's or lot's material went).
 * The kind is checked against the direction by the trace's own query schema.
 */
export const EpcisTraceQuerySchema = z.object({
  dir: oneOf("Direction", TRACE_DIRECTIONS),
  kind: z.enum([...BACKWARD_KINDS, ...FORWARD_KINDS], {
    error: `Kind must be one of: ${[...BACKWARD_KINDS, ...FORWARD_KINDS].join(", ")}`,
  }),
  code: code("Code"),
  /** Backward from a tank only: the moment to look into the tank. */
  at: z.preprocess(blank, when("Tank time").optional()),
});
export type EpcisTraceQuery = z.output<typeof EpcisTraceQuerySchema>;
