import AxeBuilder from "@axe-core/playwright";
import { request } from "@playwright/test";
import { expect, test } from "./support/test";
import type { Page } from "@playwright/test";
import { signIn } from "./support/sign-in";

/** WCAG 2.1 AA as axe-core checks it: no serious or critical violations on the page as it stands. */
async function expectAccessible(page: Page): Promise<void> {
  const results = await new AxeBuilder({ page }).analyze();
  expect(
    results.violations
      .filter((v) => v.impact === "serious" || v.impact === "critical")
      .map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`),
  ).toEqual([]);
}

// A fresh server's first signed-in page starts the trace index in the background; let that happen
// before the journeys so their sign-ins are not timed against a cold start.
test.beforeAll(async ({ baseURL }) => {
  const warm = await request.newContext({ baseURL });
  expect(
    (await warm.post("/api/session", { data: { login: "compliance.nell", password: "quillmoor-demo" } })).status(),
  ).toBe(200);
  expect((await warm.get("/waste")).status()).toBe(200);
  expect((await warm.get("/waste/due")).status()).toBe(200);
  await warm.dispose();
});

// Waste from opening to haul-away: compliance opens a container, production finishes a batch into it from
// the finish screen, compliance records its characterisation, marks it full and records the haul under a
// manifest; an over-haul is refused naming what the container holds, with everything typed kept.
test("open a waste container, fill it from a batch, characterise it, mark it full and haul it away", async ({
  browser,
  baseURL,
}) => {
  test.setTimeout(180_000);
  const stamp = Date.now().toString(36).toUpperCase();
  const code = `WC-${stamp}`;
  const batch = `WB-${stamp}`;
  const manifest = `MAN-E2E-${stamp}`;
  const nell = await (await browser.newContext({ baseURL })).newPage();
  const tess = await (await browser.newContext({ baseURL })).newPage();
  const consoleErrors: string[] = [];
  for (const p of [nell, tess])
    p.on("console", (m) => (m.type() === "error" ? consoleErrors.push(m.text()) : undefined));

  // 1. Compliance opens the container from the waste page.
  await signIn(nell, "compliance.nell", "/waste");
  const open = nell.getByRole("form", { name: "Open a container" });
  await expect(nell.getByRole("complementary", { name: "Before placing a waste container" })).toContainText(
    "closed metal bin",
  );
  await open.getByRole("button", { name: "Open the container" }).click();
  await expect(open.locator(".field-error").first()).toContainText("Container code");
  await open.getByLabel("Container code").fill(code);
  await open.getByLabel("Stream").selectOption({ label: "Glycerol phase" });
  await open.getByLabel("Location").fill("Glycerol pad, bay 3");
  await open.getByLabel("Capacity (L)").fill("1000");
  await open.getByRole("button", { name: "Open the container" }).click();
  await expect(nell).toHaveURL(new RegExp(`/waste/${code}$`));
  await expect(nell.getByRole("heading", { level: 1 })).toContainText(code);
  await expect(nell.getByRole("heading", { level: 1 })).toContainText("Filling");
  const cautions = nell.getByRole("complementary", { name: "Handling glycerol phase" });
  await expect(cautions).toContainText("bonded and grounded");
  await expect(cautions).toContainText("safety data sheets");
  await expect(nell.getByRole("heading", { name: "Hazard assessment: Needs characterisation" })).toBeVisible();

  // 2. Production finishes a small batch on the finish screen, sending its glycerol phase into the new container.
  await signIn(tess, "production.tess", "/batches");
  const post = (path: string, data: unknown) =>
    tess.request.post(path, {
      headers: { "idempotency-key": `${batch}-${path.replaceAll("/", "-")}`, origin: baseURL! },
      data,
    });
  const t0 = Date.now();
  expect(
    (
      await post("/api/batches/plan", {
        code: batch,
        plannedAt: new Date(t0 - 60_000).toISOString(),
        targetOilKg: 2,
        catalyst: "KOH",
      })
    ).status(),
  ).toBe(200);
  const started = await post("/api/batches/start", {
    batchCode: batch,
    startedAt: new Date(t0).toISOString(),
    charges: [
      { fromKind: "TANK", fromCode: "T1", role: "OIL", massKg: 2 },
      { fromKind: "TANK", fromCode: "M1", role: "METHANOL", massKg: 0.4 },
    ],
  });
  expect(started.status()).toBe(200);
  await tess.goto(`/batches/${batch}/record`);
  await expect(tess.getByRole("heading", { level: 1 })).toHaveText(`Finish batch ${batch}`);
  for (const row of [5, 4, 3]) await tess.getByRole("button", { name: `Remove output row ${row}` }).click();
  await tess.getByLabel("Output mass in kg, row 1").fill("1.9");
  await tess.getByLabel("Destination code, row 2").fill(code);
  await tess.getByLabel("Output mass in kg, row 2").fill("0.5");
  await expect(tess.getByTestId("left-to-account")).toHaveText("0.000 kg");
  await tess.getByRole("button", { name: "Record the finish" }).click();
  await expect(tess).toHaveURL(new RegExp(`/batches/${batch}$`));

  // 3. Compliance sees the contents and the movement in, then records the characterisation.
  await nell.reload();
  await expect(nell.locator(".facts").getByText("0.5 kg").first()).toBeVisible();
  const movements = nell.getByRole("table", { name: "Movements in and out" });
  await expect(movements.getByRole("link", { name: batch })).toBeVisible();
  await nell.getByText("Record a new characterisation").click();
  const lab = nell.getByRole("form", { name: "Record a characterisation" });
  await lab.getByLabel("Methanol (% v/v)").fill("11.5");
  await lab.getByLabel("pH").fill("10.4");
  await lab.getByLabel("Flash point, closed cup (°C)").fill("38");
  await lab.getByLabel("Water (% by weight)").fill("6");
  await lab.getByRole("button", { name: "Record the characterisation" }).click();
  await expect(nell.getByRole("heading", { name: "Hazard assessment: Hazardous" })).toBeVisible();
  await expect(nell.getByRole("row", { name: /Ignitable \(D001\)/ })).toContainText("Yes");

  // The waste-due list reads the same live records: the container is there, with its hazard class.
  await nell.goto("/waste/due");
  const onSite = nell
    .getByRole("row")
    .filter({ has: nell.getByRole("link", { name: code, exact: true }) })
    .last();
  await expect(onSite).toContainText("Hazardous");
  await expect(onSite).toContainText("D001 yes");

  // 4. Mark it full.
  await onSite.getByRole("link", { name: `Record haul-away of ${code}` }).click();
  await expect(nell).toHaveURL(new RegExp(`/waste/${code}#haul-away$`));
  const full = nell.getByRole("form", { name: "Mark the container full" });
  await full.getByRole("button", { name: "Mark full" }).click();
  await expect(nell.getByRole("heading", { level: 1 })).toContainText("Full, awaiting haul");
  await expect(nell.getByRole("form", { name: "Mark the container full" })).toHaveCount(0);

  // 5. An over-haul is refused, naming what the container holds; what was typed stays.
  const haul = nell.getByRole("form", { name: "Record a haul-away" });
  await haul.getByLabel("Manifest or document number").fill(manifest);
  await haul.getByLabel("Hauler").fill("Brannick Liquid Waste");
  await haul.getByLabel("Quantity collected (kg)").fill("40");
  await haul.getByLabel("Destination facility").fill("Orrinford Glycerin Recovery");
  await haul.getByRole("button", { name: "Record the haul-away" }).click();
  await expect(haul.locator(".field-error")).toContainText("holds 0.5 kg");
  await expect(haul.getByLabel("Manifest or document number")).toHaveValue(manifest);
  await expect(haul.getByLabel("Hauler")).toHaveValue("Brannick Liquid Waste");
  await expect(haul.getByLabel("Quantity collected (kg)")).toHaveValue("40");
  await expect(haul.getByLabel("Destination facility")).toHaveValue("Orrinford Glycerin Recovery");
  await nell.screenshot({ path: "/tmp/waste-over-haul.png", fullPage: true });
  await expectAccessible(nell);

  // 6. The real quantity empties the container: hauled away, and gone from the due list.
  await haul.getByLabel("Quantity collected (kg)").fill("0.5");
  await haul.getByRole("button", { name: "Record the haul-away" }).click();
  await expect(nell.getByRole("heading", { level: 1 })).toContainText("Hauled away");
  const hauls = nell.getByRole("table", { name: "Hauled from this container" });
  await expect(hauls).toContainText(manifest);
  await expect(hauls).toContainText("Orrinford Glycerin Recovery");
  await nell.screenshot({ path: "/tmp/waste-container.png", fullPage: true });
  await nell.goto("/waste/due");
  await expect(nell.getByRole("heading", { name: "Every container on site" })).toBeVisible();
  await expect(nell.getByRole("link", { name: code, exact: true })).toHaveCount(0);
  await nell.screenshot({ path: "/tmp/waste-due.png", fullPage: true });
  await nell.goto("/waste");
  await expect(nell.getByRole("row").filter({ hasText: code }).first()).toContainText("Hauled away");
  await nell.screenshot({ path: "/tmp/waste-list.png", fullPage: true });
  expect(consoleErrors).toEqual([]);
});

async function openAs(page: Page, login: string, code: string): Promise<void> {
  await signIn(page, login, "/waste");
  const open = page.getByRole("form", { name: "Open a container" });
  await open.getByLabel("Container code").fill(code);
  await open.getByLabel("Stream").selectOption({ label: "Spent filter media" });
  await open.getByLabel("Capacity (L)").fill("200");
  await open.getByRole("button", { name: "Open the container" }).click();
  await expect(page).toHaveURL(new RegExp(`/waste/${code}$`));
}

test("production opens a filter-media bin and sees its self-heating caution; only compliance records hauls", async ({
  page,
  baseURL,
}) => {
  const code = `FM-${Date.now().toString(36).toUpperCase()}`;
  await openAs(page, "production.tess", code);
  await expect(page.getByRole("complementary", { name: "Handling spent filter media" })).toContainText("heat itself");
  await expect(page.getByRole("form", { name: "Record a haul-away" })).toHaveCount(0);
  await expect(page.getByText("Compliance staff record haul-aways.")).toBeVisible();
  await page.getByText("Record a new characterisation").click();
  await expectAccessible(page);
  // Marking full twice is not offered; the form leaves once it is full.
  await page.getByRole("form", { name: "Mark the container full" }).getByRole("button", { name: "Mark full" }).click();
  await expect(page.getByRole("heading", { level: 1 })).toContainText("Full, awaiting haul");
  await page.screenshot({ path: "/tmp/waste-filter-media.png", fullPage: true });
  // The JSON endpoint answers a second "full" with a conflict, and a haul by production with a role refusal.
  const headers = { "idempotency-key": `${code}-full-again`, origin: baseURL! };
  const again = await page.request.post("/api/waste/full", {
    headers,
    data: { containerCode: code, fullAt: new Date().toISOString() },
  });
  expect(again.status()).toBe(409);
  expect(JSON.stringify(await again.json())).toContain("already marked full");
  const haul = await page.request.post("/api/waste/disposals", {
    headers: { ...headers, "idempotency-key": `${code}-haul` },
    data: {
      containerCode: code,
      documentNo: `M-${code}`,
      hauler: "H",
      disposedAt: new Date().toISOString(),
      massKg: 1,
      destination: "D",
    },
  });
  expect(haul.status()).toBe(403);
});

// The site's waste rule set: compliance names its own set with a shorter accumulation time, and a new
// container's due date follows it on the container page; the federal set is restored at the end.
test("compliance chooses the site's own waste rule set and a container's due date follows it", async ({ page }) => {
  test.setTimeout(120_000);
  const stamp = Date.now().toString(36).toUpperCase();
  const code = `WR-${stamp}`;
  const consoleErrors: string[] = [];
  page.on("console", (m) => (m.type() === "error" ? consoleErrors.push(m.text()) : undefined));
  await signIn(page, "compliance.nell", "/waste");
  const open = page.getByRole("form", { name: "Open a container" });
  await open.getByLabel("Container code").fill(code);
  await open.getByLabel("Stream").selectOption({ label: "Methanol-rich liquid" });
  await open.getByLabel("Capacity (L)").fill("200");
  await open.getByRole("button", { name: "Open the container" }).click();
  await expect(page).toHaveURL(new RegExp(`/waste/${code}$`));
  await expect(page.getByRole("complementary", { name: /Handling methanol-rich/i })).toContainText("highly flammable");

  const choose = async (fill: (form: ReturnType<typeof page.getByRole>) => Promise<void>) => {
    await page.goto("/waste/rules");
    await expect(page.getByRole("heading", { level: 1, name: "Waste rule set" })).toBeVisible();
    const form = page.getByRole("form", { name: "Choose the waste rule set" });
    await fill(form);
    await form.getByRole("button", { name: "Save the rule set" }).click();
    await expect(form.getByRole("status")).toContainText("Rule set saved");
  };
  // Federal rules for a large quantity generator: 90 days (40 CFR 262.17(a)).
  await choose(async (form) => {
    await form.getByLabel("Rule set", { exact: true }).selectOption("US_FEDERAL");
    await form.getByLabel("Generator category").selectOption("LQG");
    await form.getByLabel("Reason").fill("E2E: federal large quantity generator");
  });
  await page.goto(`/waste/${code}`);
  await expect(page.getByText(/90 days, 40 CFR 262\.17/)).toBeVisible();

  // An own set without a name is refused next to the name, nothing saved.
  await page.goto("/waste/rules");
  const form = page.getByRole("form", { name: "Choose the waste rule set" });
  await form.getByLabel("Rule set", { exact: true }).selectOption("SITE_OWN");
  await form.getByLabel("Longest accumulation of hazardous waste (days)").fill("30");
  await form.getByLabel("Reason").fill("E2E: state permit condition");
  await form.getByRole("button", { name: "Save the rule set" }).click();
  await expect(form.getByText("Name the site's own rule set (e.g. the rule it follows)")).toBeVisible();
  await form.getByLabel("Name of the site's own rule set").fill("E2E state rule");
  await form.getByRole("button", { name: "Save the rule set" }).click();
  await expect(form.getByRole("status")).toContainText("Rule set saved");
  await expect(page.getByRole("table", { name: "Limits in force" })).toContainText("the site's own choice");

  await page.goto(`/waste/${code}`);
  await expect(page.getByText(/30 days, E2E state rule: E2E: state permit condition/)).toBeVisible();
  await page.goto("/waste/due");
  await expect(page.getByRole("link", { name: "E2E state rule" })).toBeVisible();

  await choose(async (f) => {
    await f.getByLabel("Rule set", { exact: true }).selectOption("US_FEDERAL");
    await f.getByLabel("Generator category").selectOption("LQG");
    await f.getByLabel("Reason").fill("E2E: back to federal large quantity generator");
  });
  expect(consoleErrors).toEqual([]);
});
