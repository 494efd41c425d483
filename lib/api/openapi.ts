// The OpenAPI 3.1 document is generated from the same zod schemas the endpoints parse with.
import { z } from "zod";

export interface EndpointDoc {
  method: "get" | "post";
  path: string;
  summary: string;
  tag: string;
  /** Request body (POST) or query parameters (GET, a flat object schema). */
  input?: z.ZodType;
  /** Success body; documents the `value` of `{ ok: true, value }`. */
  output?: z.ZodType;
}

function jsonSchema(schema: z.ZodType, io: "input" | "output"): Record<string, unknown> {
  const s = z.toJSONSchema(schema, {
    io,
    unrepresentable: "any",
    target: "draft-2020-12",
    override: (ctx) => {
      const def = (ctx.zodSchema as unknown as { _zod: { def: { type: string } } })._zod.def;
      if (def.type === "date") {
        ctx.jsonSchema.type = "string";
        ctx.jsonSchema.format = "date-time";
      }
    },
  }) as Record<string, unknown>;
  delete s.$schema;
  return s;
}

const ISSUES = {
  type: "object",
  required: ["ok", "issues"],
  properties: {
    ok: { const: false },
    issues: {
      type: "array",
      items: {
        type: "object",
        required: ["code", "message"],
        properties: { code: { type: "string", description: "stable code, e.g. LEDGER.OVERDRAW" }, message: { type: "string" }, field: { type: "string", description: "field path, e.g. charges.1.massKg" } },
      },
    },
  },
};

export function buildOpenApi(endpoints: EndpointDoc[], info: { title: string; version: string; description: string }): Record<string, unknown> {
  const paths: Record<string, Record<string, unknown>> = {};
  for (const e of endpoints) {
    const op: Record<string, unknown> = {
      summary: e.summary,
      tags: [e.tag],
      responses: {
        "200": {
          description: "Success",
          content: { "application/json": { schema: { type: "object", required: ["ok", "value"], properties: { ok: { const: true }, value: e.output ? jsonSchema(e.output, "output") : {} } } } },
        },
        "4XX": { description: "Refused: every issue names its code and, where there is one, its field", content: { "application/json": { schema: ISSUES } } },
      },
    };
    if (e.input && e.method === "post") {
      op.requestBody = { required: true, content: { "application/json": { schema: jsonSchema(e.input, "input") } } };
    }
    if (e.input && e.method === "get") {
      const schema = jsonSchema(e.input, "input") as { properties?: Record<string, unknown>; required?: string[] };
      op.parameters = Object.entries(schema.properties ?? {}).map(([name, s]) => ({ name, in: "query", required: (schema.required ?? []).includes(name), schema: s }));
    }
    (paths[e.path] ??= {})[e.method] = op;
  }
  return { openapi: "3.1.0", info, paths };
}
