import { randomUUID } from "node:crypto";
import { expect, test } from "./support/test";

// OWASP ASVS 5.0 V2.3.4 (limited resources cannot be double-booked): 1,000 draw attempts against one
// tank through the running server, 50 in flight at a time; the total drawn never exceeds its stock.
test("1,000 concurrent draws never take more than the tank holds, and each refusal says why", async ({
  request,
}, info) => {
  test.setTimeout(300_000);
  const signIn = await request.post("/api/session", { data: { login: "production.tess", password: "quillmoor-demo" } });
  expect(signIn.status()).toBe(200);
  const sink = `LT-${info.project.name.slice(0, 2).toUpperCase()}-${Date.now() % 100000}`;
  const made = await request.post("/api/tanks", {
    headers: { "idempotency-key": randomUUID() },
    data: { code: sink, name: "Load test tank", service: "FEEDSTOCK", capacityL: 1_000_000 },
  });
  expect(made.status(), await made.text()).toBe(200);
  const before = (await (await request.get("/api/holders/tank/T3")).json()) as { value: { stockG: number } };
  const stockG = before.value.stockG;
  expect(stockG).toBeGreaterThan(1_000_000);
  const perDrawG = Math.ceil(stockG / 600); // 1,000 attempts ask for about 1.7 × the stock
  const attempts = 1000;
  const statuses: number[] = [];
  const refusals: Array<{ code: string; message: string; field?: string }> = [];
  let next = 0;
  async function worker(): Promise<void> {
    while (next < attempts) {
      next++;
      const r = await request.post("/api/transfers", {
        headers: { "idempotency-key": randomUUID() },
        data: {
          fromKind: "TANK",
          fromCode: "T3",
          toTankCode: sink,
          at: new Date().toISOString(),
          massKg: perDrawG / 1000,
        },
      });
      statuses.push(r.status());
      if (r.status() !== 200)
        refusals.push(
          ...((await r.json()) as { issues: Array<{ code: string; message: string; field?: string }> }).issues,
        );
    }
  }
  await Promise.all(Array.from({ length: 50 }, worker));
  const granted = statuses.filter((s) => s === 200).length;
  const after = (await (await request.get("/api/holders/tank/T3")).json()) as { value: { stockG: number } };
  const sinkStock = (await (await request.get(`/api/holders/tank/${sink}`)).json()) as { value: { stockG: number } };
  console.log(
    `${info.project.name}: ${granted} granted, ${attempts - granted} refused; drew ${(granted * perDrawG) / 1000} kg of ${stockG / 1000} kg`,
  );
  expect(statuses.length).toBe(attempts);
  expect(statuses.filter((s) => s >= 500)).toEqual([]);
  expect(granted * perDrawG).toBeLessThanOrEqual(stockG);
  expect(after.value.stockG).toBe(stockG - granted * perDrawG);
  expect(sinkStock.value.stockG).toBe(granted * perDrawG);
  expect(after.value.stockG).toBeLessThan(perDrawG); // it was drawn down as far as whole draws allow
  expect(refusals.length).toBe(attempts - granted);
  for (const r of refusals) {
    expect(r.code).toBe("LEDGER.OVERDRAW");
    expect(r.field).toBe("massKg");
    expect(r.message).toMatch(/holds .* kg; cannot draw/);
  }
});
