import { z } from "zod";
import { id, oneOf, requiredText } from "@/lib/core/fields";
import { BATCH_INPUT_ROLES } from "@/lib/core/vocabulary";

// A mistake is never deleted: a transfer is cancelled by a reversing movement, a lab result is voided.
// Both need a reason, which the audit trail keeps.

const reason = requiredText("Reason", 300).refine(
  (r) => r.length >= 3,
  "Reason: say in a few words what was wrong (at least 3 characters)",
);

export const ReverseMovementSchema = z.object({ movementId: id("Movement number"), reason });
export type ReverseMovementInput = z.input<typeof ReverseMovementSchema>;

export const VoidLabResultSchema = z.object({
  kind: oneOf("Result kind", ["TITRATION", "LAB_TEST"] as const),
  resultId: id("Result number"),
  reason,
});
export type VoidLabResultInput = z.input<typeof VoidLabResultSchema>;

/**
 * What staff may reverse by hand: a transfer into a tank, and a charge into a batch that is still
 * reacting (taken back to where it came from). Receiving pickups into a lot, charges of a finished
 * batch and batch outputs belong to their lot or batch record and are not reversed here.
 */
export const REVERSIBLE_ROLES = ["TRANSFER"] as const;
export const REVERSIBLE_INTO = ["TANK"] as const;
export const REVERSIBLE_CHARGE_ROLES = BATCH_INPUT_ROLES;

export function isReversible(role: string, toKind: string): "TRANSFER" | "CHARGE" | null {
  if ((REVERSIBLE_ROLES as readonly string[]).includes(role) && (REVERSIBLE_INTO as readonly string[]).includes(toKind))
    return "TRANSFER";
  if ((REVERSIBLE_CHARGE_ROLES as readonly string[]).includes(role) && toKind === "BATCH") return "CHARGE";
  return null;
}
