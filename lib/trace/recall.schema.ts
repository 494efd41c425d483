// Recall questions: follow forward what moved into a holder (a source's pickups and deliveries, a
// pickup, a lot, a tank within a window, a batch, a product lot), and put what is still on site on hold.
import { z } from "zod";
import { code, oneOf, requiredText, when } from "@/lib/core/fields";
import { DECISION_REASON_MAX } from "@/lib/product/product.schema";

export const RECALL_KINDS = ["SOURCE", "PICKUP", "LOT", "TANK", "BATCH", "PRODUCT_LOT"] as const;
export type RecallKind = (typeof RECALL_KINDS)[number];

/** Query strings send "" for an empty field. */
const blank = (v: unknown) => (v === "" || v === null ? undefined : v);

const RecallSubject = z.object({
  kind: oneOf("Start from", RECALL_KINDS),
  code: code("Code"),
  /** Only material that moved in at or after this instant (a source's pickups observed from then). */
  from: z.preprocess(blank, when("From").optional()),
  /** Only material that moved in before this instant. */
  to: z.preprocess(blank, when("To").optional()),
});

const windowInOrder = (q: { from?: Date | undefined; to?: Date | undefined }) =>
  q.from === undefined || q.to === undefined || q.from < q.to;
const WINDOW_MESSAGE = { message: "To must be after From", path: ["to"] };

export const RecallQuerySchema = RecallSubject.refine(windowInOrder, WINDOW_MESSAGE);
export type RecallQuery = z.output<typeof RecallQuerySchema>;

/** Hold every product lot the recall reaches that still holds traced material on site. */
export const RecallHoldSchema = RecallSubject.extend({
  reason: requiredText("Reason", DECISION_REASON_MAX).min(5, "Reason: at least 5 characters"),
}).refine(windowInOrder, WINDOW_MESSAGE);
export type RecallHold = z.output<typeof RecallHoldSchema>;
