// Writes TypeScript types for the OpenAPI document (`npm run api:types`); the output is committed and
// a unit test checks it is current, so a partner's generated client and ours never drift apart.
import { writeFileSync } from "node:fs";
import { apiTypesSource } from "@/lib/api/client/generate";

writeFileSync(new URL("../lib/api/client/openapi-types.ts", import.meta.url), await apiTypesSource());
