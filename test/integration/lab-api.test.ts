import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { createTestPlant } from "./support/plant";
import type { Result } from "@/lib/core/result";
import { buildOpenApi } from "@/lib/api/openapi";
import { ENDPOINTS } from "@/lib/api/endpoints";
import {
  LAB_ENDPOINTS,
  answerAcidValueFfa,
  answerSampleSize,
  answerTitration,
  answerVolumeMass,
  answerYield,
  AcidValueFfaRequestSchema,
  VolumeMassRequestSchema,
} from "@/lib/api/endpoints/lab";
import { TitrationEntrySchema } from "@/lib/titration/titration.schema";
import { decideLot, receiveDelivery, recordLabTest } from "@/lib/feedstock/lot.service";
import { recordTitration } from "@/lib/feedstock/titration.service";

// Route handlers read the session through next/headers and the database through getDb; both are replaced
// here so the handlers' own steps (same-origin check, role, parse, service, status) run as in the server.
const session = vi.hoisted(() => ({
  db: null as unknown,
  user: null as null | { siteId: number; userId: number; now: Date; role: string },
}));
vi.mock("@/lib/core/db", () => ({ getDb: () => Promise.resolve(session.db) }));
vi.mock("@/lib/auth/request.service", async () => (await import("./support/request-mock")).requestServiceMock(session));

function value<T>(r: Result<T>): T {
  if (!r.ok) throw new Error(`expected success, got ${JSON.stringify(r.issues)}`);
  return r.value;
}

function post(path: string, body: unknown, headers: Record<string, string> = {}): Request {
  return new Request(`http://127.0.0.1${path}`, {
    method: "POST",
    headers: { "content-type": "application/json", ...headers },
    body: typeof body === "string" ? body : JSON.stringify(body),
  });
}

describe("pure answers behind the compute endpoints", () => {
  it("titration: 5.00 mL × 0.25 N × 28.2 / 7.05 g = 5.000 % FFA (AOCS Ca 5a-40, computed)", () => {
    const a = value(
      answerTitration(
        TitrationEntrySchema.parse({ sampleMassG: 7.05, titrant: "NAOH", concentrationMolL: 0.25, titreMl: 5 }),
      ),
    );
    expect(a.ffaPct).toBeCloseTo(5, 9);
    // EN 14104: 56.1 × 5 × 0.25 / 7.05 = 9.9468 mg KOH/g (hand arithmetic)
    expect(a.acidValueMgKohG).toBeCloseTo(9.9468, 4);
  });
  it("titration with a blank: (4.45 − 0.05) × 0.1 × 56.1 / 5 = 4.9368 mg KOH/g (AOCS Ca 5a-40, computed)", () => {
    const a = value(
      answerTitration(
        TitrationEntrySchema.parse({
          sampleMassG: 5,
          titrant: "KOH",
          concentrationMolL: 0.1,
          titreMl: 4.45,
          blankMl: 0.05,
        }),
      ),
    );
    expect(a.acidValueMgKohG).toBeCloseTo(4.9368, 4);
  });
  it("AV ↔ FFA: FFA 1 % oleic = 1.986 mg KOH/g; AV 1 = 0.503 % oleic (acid value definition, computed from molar masses)", () => {
    expect(
      value(answerAcidValueFfa(AcidValueFfaRequestSchema.parse({ from: "FFA", value: 1 }))).acidValueMgKohG,
    ).toBeCloseTo(1.98625, 4);
    expect(
      value(answerAcidValueFfa(AcidValueFfaRequestSchema.parse({ from: "ACID_VALUE", value: 1 }))).ffaPct,
    ).toBeCloseTo(0.50346, 4);
    // AOCS Ca 5a-40 note: × 1.99 (oleic only)
    expect(
      value(answerAcidValueFfa(AcidValueFfaRequestSchema.parse({ from: "FFA", value: 2, conversion: "ca5a40-note" })))
        .acidValueMgKohG,
    ).toBeCloseTo(3.98, 9);
    expect(
      answerAcidValueFfa(
        AcidValueFfaRequestSchema.parse({ from: "FFA", value: 2, basis: "LAURIC", conversion: "ca5a40-note" }),
      ).ok,
    ).toBe(false);
  });
  it("sample size: expected 5 % FFA → 7.05 g, 75 mL alcohol, 0.25 N (AOCS Ca 5a-40 Table 1 via ASTM D5555-95)", () => {
    const s = value(answerSampleSize({ expectedFfaPct: 5 }));
    expect([s.sampleMassG, s.alcoholMl, s.concentrationsMolL]).toEqual([7.05, 75, [0.25]]);
    // 0.25 × 28.2 / 7.05 = 1.00 % FFA per mL (AOCS Ca 5a-40 Table 1)
    expect(s.ffaPctPerMl[0]).toBeCloseTo(1, 9);
  });
  it("volume → mass at 15 °C: 1000 L of water at 15 °C = 999.1026 kg (Tanaka et al. 2001 table value)", () => {
    const v = value(
      answerVolumeMass(
        VolumeMassRequestSchema.parse({
          direction: "VOLUME_TO_MASS",
          observation: { materialKind: "WATER", volume: 1000, temperature: 15 },
        }),
      ),
    );
    expect(v.massKg).toBeCloseTo(999.1026, 3);
    expect(v.standardVolumeL).toBeCloseTo(1000, 9);
  });
  it("60 °F reference is 15.5556 °C (NIST SP 811); a US gallon is 3.785 411 784 L (NIST HB 44 App. C)", () => {
    const v = value(
      answerVolumeMass(
        VolumeMassRequestSchema.parse({
          direction: "VOLUME_TO_MASS",
          observation: { materialKind: "WATER", volume: 1, volumeUnit: "US gal", temperature: 15 },
          reference: "60F",
        }),
      ),
    );
    expect(v.referenceTempC).toBeCloseTo(15.5556, 4);
    expect(v.observedVolumeL).toBeCloseTo(3.785411784, 12);
  });
  it("mass → volume and back keeps the mass", () => {
    const v = value(
      answerVolumeMass(
        VolumeMassRequestSchema.parse({
          direction: "MASS_TO_VOLUME",
          materialKind: "WATER",
          massKg: 999.1026,
          temperatureC: 15,
        }),
      ),
    );
    // Tanaka et al. 2001: 999.1026 kg/m³ at 15 °C → 1000 L
    expect(v.observedVolumeL).toBeCloseTo(1000, 3);
  });
  it("yield: triolein 1000 kg, ester 954.3225 kg → 0.95 of the 1004.55 kg theory (triolein model, IUPAC 2021 atomic weights, computed)", () => {
    const y = value(
      answerYield({
        recipe: {
          lots: [{ lotRef: "T", massKg: 1000, ffaPct: 0, waterPct: 0 }],
          settings: {
            catalyst: "NAOH",
            purityPct: 100,
            baseDosePctOfOil: 0.5,
            meanTgMolarMass: 885.453,
            molarRatio: 6,
          },
        },
        actuals: { esterKg: 954.3225, glycerolPhaseKg: 180, catalystProductUsedKg: 5, methanolAddedKg: 217.12 },
      }),
    );
    expect(y.esterYieldVsTheory).toBeCloseTo(0.95, 4);
  });
});

describe("OpenAPI document", () => {
  const doc = buildOpenApi(ENDPOINTS, { title: "Tracevat API", version: "test", description: "d" }) as {
    openapi: string;
    paths: Record<
      string,
      Record<
        string,
        {
          requestBody?: { content: Record<string, { schema: unknown }> };
          parameters?: Array<{ name: string; in: string }>;
          responses: Record<string, unknown>;
        }
      >
    >;
  };

  const expected: Array<[string, "get" | "post"]> = [
    ["/api/compute/titration", "post"],
    ["/api/compute/acid-value-ffa", "post"],
    ["/api/compute/sample-size", "get"],
    ["/api/compute/volume-mass", "post"],
    ["/api/compute/recipe", "post"],
    ["/api/compute/pretreatment", "post"],
    ["/api/compute/blend", "post"],
    ["/api/compute/yield", "post"],
    ["/api/lab/titrations", "post"],
    ["/api/lab/tests", "post"],
    ["/api/lab/decisions", "post"],
    ["/api/batches/propose", "post"],
    ["/api/batches/plan", "post"],
    ["/api/batches/start", "post"],
    ["/api/batches/complete", "post"],
    ["/api/batches/yield", "get"],
  ];

  it("is OpenAPI 3.1 with every lab and planning endpoint", () => {
    expect(doc.openapi).toBe("3.1.0");
    expect(LAB_ENDPOINTS.map((e) => [e.path, e.method])).toEqual(expected);
  });

  it.each(expected)("%s %s has an input schema and both responses", (path, method) => {
    const op = doc.paths[path]?.[method];
    expect(op).toBeDefined();
    if (method === "post") {
      const schema = op?.requestBody?.content["application/json"]?.schema as
        { type?: string; anyOf?: unknown; oneOf?: unknown; allOf?: unknown } | undefined;
      expect(schema).toBeDefined();
      expect(
        schema?.type === "object" ||
          schema?.anyOf !== undefined ||
          schema?.oneOf !== undefined ||
          schema?.allOf !== undefined,
      ).toBe(true);
    } else {
      expect(op?.parameters?.length ?? 0).toBeGreaterThan(0);
      expect(op?.parameters?.every((p) => p.in === "query")).toBe(true);
    }
    expect(Object.keys(op?.responses ?? {})).toEqual(["200", "4XX"]);
  });

  it("the titration body lists the fields the lab form sends, with the schema's limits", () => {
    const body = doc.paths["/api/lab/titrations"]?.post?.requestBody?.content["application/json"]?.schema as {
      properties: Record<string, { maximum?: number }>;
      required: string[];
    };
    expect(Object.keys(body.properties)).toEqual(
      expect.arrayContaining([
        "lotCode",
        "testedAt",
        "sampleMassG",
        "titrant",
        "concentrationMolL",
        "titreMl",
        "blankMl",
        "basis",
      ]),
    );
    expect(body.properties.concentrationMolL?.maximum).toBe(2);
    expect(body.required).toEqual(expect.arrayContaining(["lotCode", "testedAt", "titreMl"]));
  });
});

describe.each(PROVIDERS)("lab services and route handlers on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
    session.db = t.db;
    value(
      await receiveDelivery(t.db, plant.production, {
        code: "LAB-1",
        material: "USED_COOKING_OIL",
        receivedAt: "2026-02-20T10:00:00Z",
        observedVolumeL: 500,
        observedTempC: 15,
        supplierCode: "R1",
        deliveryDocument: "DN-1",
      }),
    );
  });
  afterAll(async () => {
    session.db = null;
    session.user = null;
    await t.drop();
  });

  it("a lot cannot be accepted before it has a titration; then it can", async () => {
    const refused = await decideLot(t.db, plant.production, { lotCode: "LAB-1", status: "ACCEPTED" });
    expect(refused.ok ? [] : refused.issues.map((i) => [i.code, i.field])).toEqual([["LOT.NO_FFA", "status"]]);
    // AOCS Ca 5a-40: 10.00 mL × 0.1 N × 28.2 / 28.2 g = 1.000 % (AOCS Ca 5a-40, computed)
    const saved = value(
      await recordTitration(t.db, plant.production, {
        lotCode: "LAB-1",
        testedAt: "2026-02-21T09:00:00Z",
        sampleMassG: 28.2,
        titrant: "NAOH",
        concentrationMolL: 0.1,
        titreMl: 10,
      }),
    );
    expect(saved.ffaPct).toBeCloseTo(1, 12);
    value(
      await recordLabTest(t.db, plant.production, {
        lotCode: "LAB-1",
        testedAt: "2026-02-21T09:10:00Z",
        kind: "WATER",
        method: "Karl Fischer",
        valuePct: 0.1,
      }),
    );
    expect(value(await decideLot(t.db, plant.production, { lotCode: "LAB-1", status: "ACCEPTED" })).status).toBe(
      "ACCEPTED",
    );
  });

  it("POST /api/lab/titrations: production records, FFA computed on the server; other roles are refused", async () => {
    const { POST } = await import("@/app/api/lab/titrations/route");
    session.user = {
      siteId: plant.siteId,
      userId: plant.production.userId,
      now: plant.production.now,
      role: "PRODUCTION",
    };
    const res = await POST(
      post("/api/lab/titrations", {
        lotCode: "lab-1",
        testedAt: "2026-02-22T09:00:00Z",
        sampleMassG: 7.05,
        titrant: "NAOH",
        concentrationMolL: 0.25,
        titreMl: 5,
      }),
    );
    expect(res.status).toBe(200);
    const body = (await res.json()) as { ok: boolean; value: { ffaPct: number } };
    // 5.000 % (AOCS Ca 5a-40, computed)
    expect(body.value.ffaPct).toBeCloseTo(5, 9);
    session.user = { ...session.user, role: "COMPLIANCE" };
    const forbidden = await POST(post("/api/lab/titrations", { lotCode: "LAB-1" }));
    expect(forbidden.status).toBe(403);
    session.user = null;
    expect((await POST(post("/api/lab/titrations", {}))).status).toBe(401);
  });

  it("a bad body is a 422 naming the field; a body that is not JSON says so; a cross-site POST is refused", async () => {
    const { POST } = await import("@/app/api/lab/titrations/route");
    session.user = {
      siteId: plant.siteId,
      userId: plant.production.userId,
      now: plant.production.now,
      role: "PRODUCTION",
    };
    const bad = await POST(
      post("/api/lab/titrations", {
        lotCode: "LAB-1",
        testedAt: "2026-02-22T09:00:00Z",
        sampleMassG: 7.05,
        titrant: "NAOH",
        concentrationMolL: 0.25,
        titreMl: 1,
        blankMl: 2,
      }),
    );
    expect(bad.status).toBe(422);
    const issues = ((await bad.json()) as { issues: Array<{ field?: string; message: string }> }).issues;
    expect(issues).toContainEqual(
      expect.objectContaining({ field: "blankMl", message: "blank (mL) must not exceed the titre (mL)" }),
    );
    const notJson = await POST(post("/api/lab/titrations", "{oops"));
    expect(((await notJson.json()) as { issues: Array<{ code: string }> }).issues[0]?.code).toBe("INPUT.NOT_JSON");
    const cross = await POST(post("/api/lab/titrations", {}, { "sec-fetch-site": "cross-site" }));
    expect(cross.status).toBe(403);
    expect(await t.db.titration.count({ where: { lot: { code: "LAB-1" } } })).toBe(2);
  });

  it("POST /api/compute/titration answers any signed-in role without writing", async () => {
    const { POST } = await import("@/app/api/compute/titration/route");
    session.user = {
      siteId: plant.siteId,
      userId: plant.compliance.userId,
      now: plant.compliance.now,
      role: "COMPLIANCE",
    };
    const before = await t.db.titration.count();
    const res = await POST(
      post("/api/compute/titration", { sampleMassG: 56.4, titrant: "NAOH", concentrationMolL: 0.1, titreMl: 2 }),
    );
    const body = (await res.json()) as { ok: boolean; value: { ffaPct: number } };
    // 2.00 mL × 0.1 × 28.2 / 56.4 g = 0.100 % (AOCS Ca 5a-40, computed)
    expect(body.value.ffaPct).toBeCloseTo(0.1, 12);
    expect(await t.db.titration.count()).toBe(before);
  });

  it("GET /api/compute/sample-size reads the query; an out-of-range FFA is a 422 naming it", async () => {
    const { GET } = await import("@/app/api/compute/sample-size/route");
    session.user = {
      siteId: plant.siteId,
      userId: plant.collector.userId,
      now: plant.collector.now,
      role: "COLLECTOR",
    };
    const ok = (await (
      await GET(new Request("http://127.0.0.1/api/compute/sample-size?expectedFfaPct=0.5"))
    ).json()) as { value: { sampleMassG: number } };
    // 0.2–1.0 % FFA: 28.2 g (Ca 5a-40 Table 1)
    expect(ok.value.sampleMassG).toBe(28.2);
    const bad = await GET(new Request("http://127.0.0.1/api/compute/sample-size?expectedFfaPct=abc"));
    expect(bad.status).toBe(422);
    expect(((await bad.json()) as { issues: Array<{ field?: string }> }).issues[0]?.field).toBe("expectedFfaPct");
  });
});
