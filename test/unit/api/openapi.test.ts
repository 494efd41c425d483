import { readFileSync } from "node:fs";
import { validate } from "@readme/openapi-parser";
import { describe, expect, it } from "vitest";
import { z } from "zod";
import { buildApiDocument } from "@/lib/api/document";
import { apiTypesSource } from "@/lib/api/client/generate";
import { buildOpenApi, operationIdFor, pathParameterNames, tagName } from "@/lib/api/openapi";
import type { EndpointDoc } from "@/lib/api/openapi";

type Operation = {
  operationId?: string;
  tags?: string[];
  parameters?: Array<{ name: string; in: string; required?: boolean }>;
};
type Doc = { tags: Array<{ name: string }>; paths: Record<string, Record<string, Operation>> };

const INFO = { title: "t", version: "1", description: "d" };

function operations(doc: Doc): Array<{ path: string; method: string; op: Operation }> {
  return Object.entries(doc.paths).flatMap(([path, item]) =>
    Object.entries(item).map(([method, op]) => ({ path, method, op })),
  );
}

describe("the OpenAPI document", () => {
  // OpenAPI Specification 3.1.0, checked by a general-purpose validator (@readme/openapi-parser):
  // schema, path parameters declared for every template variable (§4.8.12.1 "required: true" for path),
  // operationIds unique (§4.8.10.1).
  it("passes a general-purpose OpenAPI validator", async () => {
    const result = await validate(structuredClone(buildApiDocument()) as never);
    expect(result.valid ? [] : result.errors).toEqual([]);
  });

  it("gives every operation a unique camelCase operationId and one tag in sentence case", () => {
    const doc = buildApiDocument() as unknown as Doc;
    const ops = operations(doc);
    expect(ops.length).toBeGreaterThan(20);
    const ids = ops.map((o) => o.op.operationId);
    expect(new Set(ids).size).toBe(ids.length);
    for (const { op } of ops) {
      expect(op.operationId).toMatch(/^(get|post)[A-Z][A-Za-z0-9]*$/);
      expect(op.tags).toHaveLength(1);
      expect(op.tags?.[0]).toMatch(/^[A-Z][a-z]*( [a-z]+)*$/);
      expect(doc.tags.map((t) => t.name)).toContain(op.tags?.[0]);
    }
  });

  it("declares each path template variable as a required path parameter", () => {
    const doc = buildApiDocument() as unknown as Doc;
    const holders = doc.paths["/api/holders/{kind}/{code}"]?.get;
    expect(holders?.parameters?.filter((p) => p.in === "path").map((p) => [p.name, p.required])).toEqual([
      ["kind", true],
      ["code", true],
    ]);
  });

  it("keeps a new entry valid without any per-entry care", async () => {
    const extra: EndpointDoc[] = [
      {
        method: "get",
        path: "/api/recalls/{recallId}/notices/{noticeNo}",
        tag: "recalls",
        summary: "x",
        input: z.object({ format: z.enum(["json", "csv"]).optional() }),
      },
      {
        method: "post",
        path: "/api/recalls/{recallId}",
        tag: "recalls",
        summary: "y",
        input: z.object({ note: z.string() }),
      },
    ];
    const doc = buildOpenApi(extra, INFO) as unknown as Doc;
    expect((await validate(structuredClone(doc) as never)).valid).toBe(true);
    expect(
      doc.paths["/api/recalls/{recallId}/notices/{noticeNo}"]?.get?.parameters?.map((p) => `${p.in}:${p.name}`),
    ).toEqual(["path:recallId", "path:noticeNo", "query:format"]);
    expect(doc.tags).toEqual([{ name: "Recalls" }]);
  });

  it("refuses to document the same operation twice", () => {
    const e: EndpointDoc = { method: "get", path: "/api/a", tag: "A", summary: "a" };
    expect(() => buildOpenApi([e, e], INFO)).toThrow(/twice/);
    expect(() => buildOpenApi([e, { ...e, path: "/api/b", operationId: "getA" }], INFO)).toThrow(/getA is used twice/);
  });
});

describe("names derived from a path", () => {
  it.each([
    ["get", "/api/holders/{kind}/{code}", "getHoldersByKindByCode"],
    ["post", "/api/compute/acid-value-ffa", "postComputeAcidValueFfa"],
    ["get", "/api/epcis/period", "getEpcisPeriod"],
    ["post", "/api/session", "postSession"],
  ])("%s %s → %s", (method, path, id) => {
    expect(operationIdFor(method, path)).toBe(id);
  });

  it("reads path parameters from the template", () => {
    expect(pathParameterNames("/api/holders/{kind}/{code}")).toEqual(["kind", "code"]);
    expect(pathParameterNames("/api/balance")).toEqual([]);
  });

  it("writes tags in sentence case", () => {
    expect(tagName("records")).toBe("Records");
    expect(tagName("Chain of custody")).toBe("Chain of custody");
  });
});

describe("the committed client types", () => {
  it("match the document (run `npm run api:types` after changing an endpoint)", async () => {
    const committed = readFileSync(new URL("../../../lib/api/client/openapi-types.ts", import.meta.url), "utf8");
    expect(committed).toBe(await apiTypesSource());
  }, 30_000);
});
