import { z } from "zod";
import type { EndpointDoc } from "@/lib/api/openapi";
import { SiteSpecInputSchema } from "@/lib/spec/site-spec.schema";

const SavedSiteSpecSchema = z.object({
  id: z.number().int(),
  key: z.string().describe("Specification key to judge product lots against, site:<id>"),
  name: z.string(),
  version: z.number().int(),
});

/** Site specifications: a named, versioned copy of a built-in edition and grade with tighter limits. */
export const SPEC_ENDPOINTS: EndpointDoc[] = [
  {
    method: "post",
    path: "/api/specs",
    tag: "Specifications",
    summary:
      "Write a site specification (compliance staff): version 1 of a new name copied from a built-in edition and grade (baseKey such as astm-d6751-23a/no-2-b-s15), or the next version when previousVersion names the current one. Limits by property may be tightened, never loosened. Idempotency-Key header required.",
    input: SiteSpecInputSchema,
    output: SavedSiteSpecSchema,
  },
];
