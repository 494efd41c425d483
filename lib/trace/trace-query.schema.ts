// What a trace is asked for: the trace page's form, GET /api/trace/backward and /forward (documented in
// lib/api/endpoints/trace.ts, which re-exports these).
import { z } from "zod";
import { code, emptyAsMissing as blank, oneOf, when } from "@/lib/core/fields";

export const BACKWARD_KINDS = ["PRODUCT_LOT", "TANK", "SHIPMENT", "BATCH"] as const;
export type BackwardKind = (typeof BACKWARD_KINDS)[number];
export const FORWARD_KINDS = ["SOURCE", "PICKUP", "LOT"] as const;
export type ForwardKind = (typeof FORWARD_KINDS)[number];

export const BackwardTraceQuerySchema = z.object({
  kind: oneOf("What to trace", BACKWARD_KINDS),
  /** A product lot, tank or batch code, or a shipment's document number. */
  code: code("Code"),
  /** Tanks only: the moment to look into the tank (ISO date-time with zone); default: after the last movement. */
  at: z.preprocess(blank, when("Tank time").optional()),
});
export type BackwardTraceQuery = z.output<typeof BackwardTraceQuerySchema>;

export const ForwardTraceQuerySchema = z.object({
  kind: oneOf("What to follow", FORWARD_KINDS),
  code: code("Code"),
});
export type ForwardTraceQuery = z.output<typeof ForwardTraceQuerySchema>;
