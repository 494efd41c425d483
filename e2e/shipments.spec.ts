import { expect, test } from "./support/test";
import type { Page } from "@playwright/test";
import { signIn } from "./support/sign-in";

// Compliance records who the fuel goes to and what left: a customer record, then a shipment of a
// released product lot to it; held product cannot leave; production staff only look.

async function stockG(page: Page, kind: string, code: string): Promise<number> {
  const res = await page.request.get(`/api/holders/${kind}/${encodeURIComponent(code)}`);
  expect(res.status()).toBe(200);
  return ((await res.json()) as { value: { stockG: number } }).value.stockG;
}

/** A product lot in the given state with at least minG in stock, picked from the product lots page. */
async function pickProductLot(
  page: Page,
  state: "Released" | "On hold",
  minG: number,
): Promise<{ code: string; stockG: number }> {
  await page.goto("/products");
  const codes = await page.locator("tbody tr").filter({ hasText: state }).locator("td:first-child").allInnerTexts();
  for (const raw of codes) {
    const code = raw.trim();
    const g = await stockG(page, "PRODUCT_LOT", code);
    if (g >= minG) return { code, stockG: g };
  }
  throw new Error(`no ${state} product lot with ${minG} g in stock on the product lots page`);
}

// The first sign-in after the server starts also starts the trace index build; on a busy machine that
// can outlast the sign-in helper's wait, so the journeys start after one signed-in page has been served.
test.beforeAll(async ({ request }) => {
  expect(
    (await request.post("/api/session", { data: { login: "compliance.nell", password: "quillmoor-demo" } })).status(),
  ).toBe(200);
  expect((await request.get("/shipments")).status()).toBe(200);
  expect((await request.get("/trace?dir=fwd&kind=LOT&code=L-0001")).status()).toBe(200);
});

test("compliance records a customer and ships part of a released product lot to it", async ({ page }) => {
  const stamp = String(Date.now() % 1_000_000);
  const customerCode = `E2E-C${stamp}`;
  const customerName = `Wrenfold Test Carriers ${stamp}`;
  const documentNo = `E2E-BOL-${stamp}`;
  await signIn(page, "compliance.nell", "/customers");

  const newCustomer = page.getByRole("form", { name: "New customer" });
  await newCustomer.getByLabel("Customer code").fill(customerCode);
  await newCustomer.getByLabel("Name", { exact: true }).fill(customerName);
  await newCustomer.getByLabel("Delivery address").fill("2 Ferry Lane, Wrenfold");
  await newCustomer.getByLabel("Contact").fill("Yard office, Pim Adderley");
  await newCustomer.getByRole("button", { name: "Record the customer" }).click();
  await expect(newCustomer.getByRole("status")).toContainText(`Customer ${customerCode} recorded`);
  await expect(page.getByRole("link", { name: customerName })).toBeVisible();
  await page.screenshot({ path: "/tmp/shipments-customers.png", fullPage: true });

  const lot = await pickProductLot(page, "Released", 20_000);
  await page.goto(`/products/${lot.code}`);
  await page.getByRole("link", { name: "Ship from this lot" }).click();
  await expect(page).toHaveURL(new RegExp(`/shipments/new\\?from=${lot.code}`));
  const form = page.getByRole("form", { name: "Record a shipment" });
  const line1 = form.getByRole("group", { name: "Line 1" });
  await expect(line1.getByLabel("Lot or tank number")).toHaveValue(lot.code);
  await form.getByLabel("Customer", { exact: true }).selectOption(customerCode);
  await form.getByLabel("Document number").fill(documentNo);
  await form.getByLabel("Vehicle").fill("Tanker WF-12");
  await form.getByLabel("Compartment(s)").fill("3");
  await line1.getByLabel("Quantity").fill("12.5");
  await page.screenshot({ path: "/tmp/shipments-new.png", fullPage: true });
  await form.getByRole("button", { name: "Record the shipment" }).click();
  await expect(form.getByRole("status")).toContainText(`Shipment ${documentNo} recorded: 12.5 kg left the books`);
  expect(await stockG(page, "PRODUCT_LOT", lot.code)).toBe(lot.stockG - 12_500);

  await page.goto(`/shipments/${documentNo}`);
  await expect(page.getByRole("heading", { level: 1 })).toContainText(documentNo);
  await expect(page.getByRole("link", { name: customerName })).toBeVisible();
  await expect(page.getByText("Tanker WF-12")).toBeVisible();
  const lines = page.getByRole("table", { name: /loading line/ });
  await expect(lines.getByRole("link", { name: new RegExp(lot.code) })).toBeVisible();
  await expect(page.getByRole("button", { name: "Print" })).toBeVisible();
  await page.screenshot({ path: "/tmp/shipments-page.png", fullPage: true });

  await page.getByRole("link", { name: customerName }).click();
  await expect(page).toHaveURL(new RegExp(`/customers/${customerCode}$`));
  await expect(page.getByRole("link", { name: documentNo, exact: true })).toBeVisible();

  // A change keeps the old value in the customer's history, with the reason.
  await page.getByText("Change this customer").click();
  const change = page.getByRole("form", { name: `Change customer ${customerCode}` });
  await change.getByLabel("Contact").fill("Yard office, Pim Adderley (weekdays only)");
  await change.getByRole("button", { name: "Save the change" }).click();
  await expect(change.locator(".field-error")).toContainText("Reason for the change is required");
  await change.getByLabel("Reason for the change").fill("Deliveries on weekdays only");
  await change.getByRole("button", { name: "Save the change" }).click();
  await expect(change.getByRole("status")).toContainText("changed (contact)");
  await page.screenshot({ path: "/tmp/shipments-customer.png", fullPage: true });
  await page.getByRole("link", { name: `History of customer ${customerCode}` }).click();
  await expect(page.getByRole("cell", { name: "Deliveries on weekdays only" })).toBeVisible();

  // The forward trace of a feedstock lot in this shipment names the customer.
  await page.goto(`/shipments/${documentNo}`);
  const feedLot = (
    await page
      .getByRole("link", { name: /^L-\d+$/ })
      .first()
      .innerText()
  ).trim();
  await page.goto(`/trace?dir=fwd&kind=LOT&code=${feedLot}`);
  await expect(page.getByRole("heading", { name: "Shipped to customers" })).toBeVisible({ timeout: 60_000 });
  await expect(page.getByRole("link", { name: customerName }).first()).toBeVisible();
  await page.screenshot({ path: "/tmp/shipments-trace.png", fullPage: true });
});

test("shipping from a held product lot is refused with the lot named and the typed values kept", async ({ page }) => {
  const stamp = String(Date.now() % 1_000_000);
  const documentNo = `E2E-HOLD-${stamp}`;
  await signIn(page, "compliance.nell", "/shipments");
  const held = await pickProductLot(page, "On hold", 1_000);
  const heldBefore = held.stockG;
  const tankBefore = await stockG(page, "TANK", "P1");
  await page.goto("/shipments");
  await page.getByText("Record a shipment", { exact: true }).click();
  const form = page.getByRole("form", { name: "Record a shipment" });
  await form.getByLabel("Customer", { exact: true }).selectOption({ index: 1 });
  await form.getByLabel("Document number").fill(documentNo);
  await form.getByLabel("Vehicle").fill("Tanker HX-4");
  const line1 = form.getByRole("group", { name: "Line 1" });
  await line1.getByLabel("Lot or tank number").fill(held.code);
  await line1.getByLabel("Quantity").fill("5");
  await form.getByRole("button", { name: "Add a line" }).click();
  const line2 = form.getByRole("group", { name: "Line 2" });
  await line2.getByLabel("Loaded from").selectOption("TANK");
  await line2.getByLabel("Lot or tank number").fill("P1");
  await line2.getByLabel("Quantity").fill("10");
  await form.getByRole("button", { name: "Record the shipment" }).click();

  await expect(line1.locator(".field-error")).toHaveText(
    `Line 1: Product lot ${held.code} is on hold: it cannot leave the site until it is released`,
  );
  await expect(form.getByLabel("Document number")).toHaveValue(documentNo);
  await expect(form.getByLabel("Vehicle")).toHaveValue("Tanker HX-4");
  await expect(line1.getByLabel("Quantity")).toHaveValue("5");
  await expect(line2.getByLabel("Loaded from")).toHaveValue("TANK");
  await expect(line2.getByLabel("Lot or tank number")).toHaveValue("P1");
  await expect(line2.getByLabel("Quantity")).toHaveValue("10");
  await page.screenshot({ path: "/tmp/shipments-refused.png", fullPage: true });
  // Nothing left: neither the held lot nor the tank of the second line.
  expect(await stockG(page, "PRODUCT_LOT", held.code)).toBe(heldBefore);
  expect(await stockG(page, "TANK", "P1")).toBe(tankBefore);
  expect((await page.request.get(`/shipments/${documentNo}`)).status()).toBe(404);
});

test("a production user can neither open shipments (customers stay with the office) nor record one", async ({
  page,
  baseURL,
}) => {
  await signIn(page, "production.tess", "/shipments");
  await expect(page.getByRole("heading", { name: "Not available to your role", level: 1 })).toBeVisible();
  await expect(page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Shipments" })).toHaveCount(0);
  await page.goto("/shipments/new");
  await expect(page.getByRole("heading", { name: "Not available to your role", level: 1 })).toBeVisible();
  await expect(page.getByRole("form", { name: "Record a shipment" })).toHaveCount(0);
  const res = await page.request.post("/api/shipments", {
    headers: { "idempotency-key": `prod-ship-${Date.now()}`, origin: baseURL! },
    data: {
      documentNo: "E2E-PROD-1",
      customerCode: "HHC",
      shippedAt: new Date().toISOString(),
      lines: [{ fromKind: "TANK", fromCode: "P1", massKg: 1 }],
    },
  });
  expect(res.status()).toBe(403);
});
