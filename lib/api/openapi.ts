// The OpenAPI 3.1 document is generated from the same zod schemas the endpoints parse with.
import { z } from "zod";

export interface EndpointDoc {
  method: "get" | "post";
  path: string;
  summary: string;
  tag: string;
  /** Request body (POST) or query parameters (GET, a flat object schema). */
  input?: z.ZodType;
  /** Success body; documents the `value` of `{ ok: true, value }` (or the whole body when `contentType` is set). */
  output?: z.ZodType;
  /** A success body that is not the JSON envelope, e.g. "application/pdf" or "application/ld+json". */
  contentType?: string;
  /** Stable name for generated clients; derived from the method and path when absent (see operationIdFor). */
  operationId?: string;
}

/** Path parameters named in a path template: "/api/holders/{kind}/{code}" → ["kind", "code"]. */
export function pathParameterNames(path: string): string[] {
  return [...path.matchAll(/\{([^}/]+)\}/g)].map((m) => m[1] ?? "");
}

function capitalise(word: string): string {
  return word.charAt(0).toUpperCase() + word.slice(1);
}

/**
 * A stable operationId from the method and the path: "get /api/holders/{kind}/{code}" →
 * "getHoldersByKindByCode", "post /api/compute/acid-value-ffa" → "postComputeAcidValueFfa".
 */
export function operationIdFor(method: string, path: string): string {
  const words = path
    .replace(/^\/api\//, "")
    .split("/")
    .filter((s) => s.length > 0)
    .flatMap((segment) => {
      const param = /^\{(.+)\}$/.exec(segment);
      return param ? ["by", ...(param[1] ?? "").split(/[^A-Za-z0-9]+/)] : segment.split(/[^A-Za-z0-9]+/);
    })
    .filter((w) => w.length > 0);
  return method.toLowerCase() + words.map(capitalise).join("");
}

/** Tags in one style, sentence case: "records" → "Records", "Chain of custody" stays. */
export function tagName(tag: string): string {
  return capitalise(tag.trim());
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
        properties: {
          code: { type: "string", description: "stable code, e.g. LEDGER.OVERDRAW" },
          message: { type: "string" },
          field: { type: "string", description: "field path, e.g. charges.1.massKg" },
        },
      },
    },
  },
};

function successContent(e: EndpointDoc): Record<string, unknown> {
  if (e.contentType === undefined) {
    return {
      "application/json": {
        schema: {
          type: "object",
          required: ["ok", "value"],
          properties: { ok: { const: true }, value: e.output ? jsonSchema(e.output, "output") : {} },
        },
      },
    };
  }
  const schema = e.output
    ? jsonSchema(e.output, "output")
    : e.contentType.startsWith("application/json") || e.contentType.endsWith("+json")
      ? {}
      : { type: "string", contentMediaType: e.contentType };
  return { [e.contentType]: { schema } };
}

function buildOperation(e: EndpointDoc): Record<string, unknown> {
  const op: Record<string, unknown> = {
    operationId: e.operationId ?? operationIdFor(e.method, e.path),
    summary: e.summary,
    tags: [tagName(e.tag)],
    responses: {
      "200": { description: "Success", content: successContent(e) },
      "4XX": {
        description: "Refused: every issue names its code and, where there is one, its field",
        content: { "application/json": { schema: ISSUES } },
      },
    },
  };
  const parameters: Array<Record<string, unknown>> = pathParameterNames(e.path).map((name) => ({
    name,
    in: "path",
    required: true,
    schema: { type: "string" },
  }));
  if (e.input && e.method === "post") {
    op.requestBody = { required: true, content: { "application/json": { schema: jsonSchema(e.input, "input") } } };
  }
  if (e.input && e.method === "get") {
    const schema = jsonSchema(e.input, "input") as { properties?: Record<string, unknown>; required?: string[] };
    for (const [name, s] of Object.entries(schema.properties ?? {}))
      parameters.push({ name, in: "query", required: (schema.required ?? []).includes(name), schema: s });
  }
  if (parameters.length > 0) op.parameters = parameters;
  return op;
}

/**
 * The OpenAPI 3.1 document. Path parameters come from the path template, operationIds from the
 * method and path unless given; a repeated operationId or method+path is a programming error.
 */
export function buildOpenApi(
  endpoints: EndpointDoc[],
  info: { title: string; version: string; description: string },
): Record<string, unknown> {
  const paths: Record<string, Record<string, unknown>> = {};
  const ids = new Set<string>();
  const tags = new Set<string>();
  for (const e of endpoints) {
    const op = buildOperation(e);
    const id = op.operationId as string;
    if (ids.has(id)) throw new Error(`OpenAPI: operationId ${id} is used twice`);
    if (paths[e.path]?.[e.method] !== undefined) throw new Error(`OpenAPI: ${e.method} ${e.path} is documented twice`);
    ids.add(id);
    tags.add(tagName(e.tag));
    (paths[e.path] ??= {})[e.method] = op;
  }
  return { openapi: "3.1.0", info, tags: [...tags].sort().map((name) => ({ name })), paths };
}
