import { expect, test } from "./support/test";
import { signIn } from "./support/sign-in";

// OWASP ASVS 5.0 V3.4: CSP with nonces, frame-ancestors, nosniff, referrer policy on every response.
test("pages carry the security headers and run under a nonce CSP without violations", async ({ page }) => {
  const violations: string[] = [];
  page.on("console", (m) => {
    if (m.type() === "error" && /Content Security Policy/i.test(m.text())) violations.push(m.text());
  });
  const login = await page.goto("/login");
  const h = login?.headers() ?? {};
  expect(h["content-security-policy"]).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]+' 'strict-dynamic'/);
  expect(h["content-security-policy"]).toContain("frame-ancestors 'none'");
  expect(h["content-security-policy"]).toContain("object-src 'none'");
  expect(h["x-content-type-options"]).toBe("nosniff");
  expect(h["referrer-policy"]).toBe("same-origin");
  await signIn(page, "compliance.nell", "/tanks");
  const again = await page.goto("/tanks");
  const nonce1 = /nonce-([^']+)/.exec(h["content-security-policy"] ?? "")?.[1];
  const nonce2 = /nonce-([^']+)/.exec(again?.headers()["content-security-policy"] ?? "")?.[1];
  expect(nonce1).toBeTruthy();
  expect(nonce2).not.toBe(nonce1);
  // Only the collect page may ask for the phone's position; every other page refuses it.
  expect(again?.headers()["permissions-policy"]).toContain("geolocation=()");
  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
  expect(violations).toEqual([]);
});

test("a data-changing API call from another site is refused", async ({ request }) => {
  const r = await request.post("/api/transfers", {
    headers: {
      origin: "http://evil.example",
      "content-type": "application/json",
      "idempotency-key": "cross-site-0001",
    },
    data: { fromKind: "TANK", fromCode: "T1", toTankCode: "T2", at: "2026-12-01T00:00:00Z", massKg: 1 },
  });
  expect([401, 403]).toContain(r.status());
});
