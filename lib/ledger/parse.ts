import type { z } from "zod";
import type { DomainIssue, Result } from "@/lib/core/result";
import { failMany, ok } from "@/lib/core/result";

/** Parses input with a shared schema; every issue names its field path (e.g. "charges.1.massKg"). */
export function parseInput<S extends z.ZodType>(schema: S, input: unknown): Result<z.output<S>> {
  const parsed = schema.safeParse(input);
  if (parsed.success) return ok(parsed.data);
  const issues: DomainIssue[] = parsed.error.issues.map((i) => {
    const field = i.path.map(String).join(".");
    return field === ""
      ? { code: "INPUT.INVALID", message: i.message }
      : { code: "INPUT.INVALID", message: i.message, field };
  });
  return failMany(issues);
}
