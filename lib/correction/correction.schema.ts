import { z } from "zod";
import { id, oneOf, requiredText } from "@/lib/ledger/fields";

// A mistake is never deleted: a transfer is cancelled by a reversing movement, a lab result is voided.
// Both need a reason, which the audit trail keeps.

const reason = requiredText("Reason", 300).refine((r) => r.length >= 3, "Reason: say in a few words what was wrong (at least 3 characters)");

export const ReverseMovementSchema = z.object({ movementId: id("Movement number"), reason });
export type ReverseMovementInput = z.input<typeof ReverseMovementSchema>;

export const VoidLabResultSchema = z.object({ kind: oneOf("Result kind", ["TITRATION", "LAB_TEST"] as const), resultId: id("Result number"), reason });
export type VoidLabResultInput = z.input<typeof VoidLabResultSchema>;

/**
 * What staff may reverse by hand: transfers into a tank. Receiving pickups into a lot, batch charges
 * and outputs belong to their lot or batch record and are corrected there.
 */
export const REVERSIBLE_ROLES = ["TRANSFER"] as const;
export const REVERSIBLE_INTO = ["TANK"] as const;
