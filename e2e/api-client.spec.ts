import createClient from "openapi-fetch";
import { expect, test } from "./support/test";
import type { paths } from "../lib/api/client/openapi-types";
import { EpcisDocumentSchema } from "../lib/epcis/epcis-document.schema";

// A partner's tool, built the way partners build them: types generated from /api/openapi.json
// (`npm run api:types`, committed) and the typed fetch client openapi-fetch. It signs in, finds a
// product lot through the path-parameter route, and reads a trace, the balance report and EPCIS events.

test("a client generated from the OpenAPI document signs in and reads a trace and a report", async ({ baseURL }) => {
  const client = createClient<paths>({ baseUrl: baseURL });
  let cookie = "";
  client.use({
    onRequest({ request }) {
      if (cookie !== "") request.headers.set("cookie", cookie);
      return request;
    },
  });

  const served = (await (await fetch(`${baseURL}/api/openapi.json`)).json()) as {
    paths: Record<string, Record<string, { operationId?: string }>>;
  };
  expect(served.paths["/api/epcis/trace"]?.get?.operationId).toBe("getEpcisTrace");

  const refused = await client.GET("/api/balance", {});
  expect(refused.response.status).toBe(401);

  const session = await client.POST("/api/session", { body: { login: "compliance.nell", password: "quillmoor-demo" } });
  expect(session.response.status).toBe(200);
  cookie = session.response.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
  expect(cookie).toMatch(/tv_session=/);

  let product: { code: string; stockG: number } | null = null;
  for (let n = 200; n > 0 && product === null; n--) {
    const code = `P-${String(n).padStart(4, "0")}`;
    const held = await client.GET("/api/holders/{kind}/{code}", { params: { path: { kind: "PRODUCT_LOT", code } } });
    const stockG = (held.data?.value as { stockG?: number } | undefined)?.stockG ?? 0;
    if (held.response.status === 200 && stockG > 0) product = { code, stockG };
  }
  if (product === null) throw new Error("no product lot with stock in the demo plant");

  const trace = await client.GET("/api/trace/backward", {
    params: { query: { kind: "PRODUCT_LOT", code: product.code } },
  });
  expect(trace.error).toBeUndefined();
  const traced = trace.data?.value as {
    target: { code: string };
    totalG: number;
    all: { byLot: Array<{ grams: number }> };
  };
  expect(traced.target.code).toBe(product.code);
  expect(traced.all.byLot.reduce((s, r) => s + r.grams, 0)).toBe(traced.totalG);

  const balance = await client.GET("/api/balance", { params: { query: { period: "MONTH" } } });
  expect(balance.error).toBeUndefined();
  const report = balance.data?.value as { period: { label: string }; stock: { closingG: number } };
  expect(report.period.label).toMatch(/^\d{4}-\d{2}$/);

  const events = await client.GET("/api/epcis/trace", {
    params: { query: { dir: "back", kind: "PRODUCT_LOT", code: product.code } },
  });
  expect(events.response.headers.get("content-type")).toContain("application/ld+json");
  const doc = EpcisDocumentSchema.parse(events.data);
  expect(doc.epcisBody.eventList.some((e) => e.type === "TransformationEvent")).toBe(true);

  const unknown = await client.GET("/api/trace/backward", {
    params: { query: { kind: "PRODUCT_LOT", code: "NO-SUCH-LOT" } },
  });
  expect(unknown.response.status).toBe(404);
  expect(unknown.error?.issues[0]?.field).toBe("code");
});
