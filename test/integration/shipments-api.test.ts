import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { createTestPlant } from "./support/plant";
import { createHolder, postMovement, requireHolder } from "@/lib/ledger/ledger.store";
import { runInTransaction } from "@/lib/ledger/transaction.store";

// The JSON endpoints' own steps (same-origin check, role, parse, service, status) with the session and
// database replaced, as in test/integration/lab-api.test.ts.
const session = vi.hoisted(() => ({
  db: null as unknown,
  user: null as null | { siteId: number; userId: number; now: Date; role: string },
}));
vi.mock("@/lib/core/db", () => ({ getDb: () => Promise.resolve(session.db) }));
vi.mock("@/lib/auth/request.service", () => ({
  requireRole: (roles: readonly string[]) => {
    const u = session.user;
    if (u === null)
      return Promise.resolve({ ok: false, issues: [{ code: "AUTH.UNAUTHENTICATED", message: "Sign in first" }] });
    if (!roles.includes(u.role))
      return Promise.resolve({ ok: false, issues: [{ code: "AUTH.FORBIDDEN", message: "wrong role" }] });
    return Promise.resolve({ ok: true, value: { ...u, login: "t", fullName: "T" } });
  },
}));

let seq = 0;
function post(path: string, body: unknown): Request {
  seq += 1;
  return new Request(`http://127.0.0.1${path}`, {
    method: "POST",
    headers: { "content-type": "application/json", "idempotency-key": `ship-api-${seq}-${Date.now()}` },
    body: JSON.stringify(body),
  });
}

describe.each(PROVIDERS)("POST /api/customers and /api/shipments on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
    session.db = t.db;
    const at = new Date("2026-02-10T08:00:00Z");
    const r = await runInTransaction(t.db, async (tx) => {
      const tank = await requireHolder(tx, plant.siteId, "TANK", "P1", "code");
      await postMovement(tx, {
        siteId: plant.siteId,
        at,
        role: "RECEIPT",
        fromHolderId: null,
        toHolderId: tank.id,
        massG: 50_000,
        recordedById: plant.production.userId,
      });
      const lot = await createHolder(tx, plant.siteId, "PRODUCT_LOT", "P-H");
      await tx.productLot.create({
        data: { siteId: plant.siteId, holderId: lot, code: "P-H", producedAt: at, massG: 10_000, status: "HELD" },
      });
      await postMovement(tx, {
        siteId: plant.siteId,
        at,
        role: "RECEIPT",
        fromHolderId: null,
        toHolderId: lot,
        massG: 10_000,
        recordedById: plant.production.userId,
      });
    });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
  });
  afterAll(async () => {
    await t.drop();
  });

  it("lets compliance record a customer and a shipment; refuses production, a held lot and a used number", async () => {
    const customers = await import("@/app/api/customers/route");
    const shipments = await import("@/app/api/shipments/route");
    const body = {
      documentNo: "API-1",
      customerCode: "API-C",
      shippedAt: "2026-02-20T10:00:00Z",
      lines: [{ fromKind: "TANK", fromCode: "P1", massKg: 20 }],
    };
    session.user = { ...plant.production, role: "PRODUCTION" };
    expect((await shipments.POST(post("/api/shipments", body))).status).toBe(403);
    expect((await customers.POST(post("/api/customers", { code: "API-C", name: "Api Carriers" }))).status).toBe(403);
    session.user = { ...plant.compliance, role: "COMPLIANCE" };
    expect((await customers.POST(post("/api/customers", { code: "API-C", name: "Api Carriers" }))).status).toBe(200);
    expect(
      (
        await shipments.POST(
          post("/api/shipments", { ...body, lines: [{ fromKind: "PRODUCT_LOT", fromCode: "P-H", massKg: 1 }] }),
        )
      ).status,
    ).toBe(409);
    const saved = await shipments.POST(post("/api/shipments", body));
    expect(saved.status).toBe(200);
    expect(((await saved.json()) as { value: { documentNo: string; massG: number } }).value).toMatchObject({
      documentNo: "API-1",
      massG: 20_000,
    });
    expect((await shipments.POST(post("/api/shipments", body))).status).toBe(409);
    expect((await shipments.POST(post("/api/shipments", { ...body, documentNo: "API-2", lines: [] }))).status).toBe(
      422,
    );
  });
});
