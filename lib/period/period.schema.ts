import { z } from "zod";
import { when } from "@/lib/core/fields";

export const AccountingPeriodSchema = z
  .object({ startsAt: when("Period start"), endsAt: when("Period end") })
  .refine((p) => p.endsAt > p.startsAt, { message: "Period end must be after its start", path: ["endsAt"] });
export type AccountingPeriodInput = z.input<typeof AccountingPeriodSchema>;
