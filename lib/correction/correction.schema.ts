import { z } from "zod";
import { id, oneOf, requiredText } from "@/lib/ledger/fields";

// A mistake is never deleted: a transfer is cancelled by a reversing movement, a lab result is voided.
// Both need a reason, which the audit trail keeps.

const reason = requiredText("Reason", 300).refine((r) => r.length >= 3, "Reason: say in a few words what was wrong (at least 3 characters)");

export const ReverseMovementSchema = z.object({ movementId: id("Movement number"), reason });
export type ReverseMovementInput = z.input<typeof ReverseMovementSchema>;

export const VoidLabResultSchema = z.object({ kind: oneOf("Result kind", ["TITRATION", "LAB_TEST"] as const), resultId: id("Result number"), reason });
export type VoidLabResultInput = z.input<typeof VoidLabResultSchema>;

/** Movement roles staff may reverse by hand; batch charges and outputs are corrected on the batch. */
export const REVERSIBLE_ROLES = ["TRANSFER"] as const;
