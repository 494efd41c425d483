import { z } from "zod";
import { code, requiredText, text } from "@/lib/core/fields";

// A customer the site ships finished fuel to. Records are changed (audited, with a reason) and
// deactivated, never deleted: shipments keep pointing at them.

export const CustomerSchema = z.object({
  code: code("Customer code"),
  name: requiredText("Customer name", 120),
  address: text("Address", 200).default(""),
  contact: text("Contact", 120).default(""),
});
export type CustomerInput = z.input<typeof CustomerSchema>;

export const CustomerChangeSchema = z.object({
  code: code("Customer code"),
  name: requiredText("Customer name", 120),
  address: text("Address", 200).default(""),
  contact: text("Contact", 120).default(""),
  active: z.boolean({ error: "Active: yes or no" }),
  reason: requiredText("Reason for the change", 300),
});
export type CustomerChangeInput = z.input<typeof CustomerChangeSchema>;
