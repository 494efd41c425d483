import { describe, expect, it } from "vitest";
import { canRead, homeFor, menuFor, readRuleFor, readersOf } from "@/lib/auth/read-matrix";
import type { ReadRule } from "@/lib/auth/read-matrix";

// The read matrix is our own least-privilege decision (OWASP ASVS 5.0 V8.2: deny by default).
describe("read matrix", () => {
  const matrix: ReadRule[] = [
    { path: "/", roles: ["PRODUCTION"], menu: "Today" },
    { path: "/balance", roles: ["COMPLIANCE"], menu: "Balance" },
    { path: "/balance/custody", roles: ["ADMIN"] },
    { path: "/login", roles: "public" },
  ];

  it("matches prefixes at segment boundaries, the longest one winning", () => {
    expect(readRuleFor("/balance", matrix)?.path).toBe("/balance");
    expect(readRuleFor("/balance/2026", matrix)?.path).toBe("/balance");
    expect(readRuleFor("/balance/custody", matrix)?.path).toBe("/balance/custody");
    expect(readRuleFor("/balancex", matrix)).toBeNull();
  });

  it("'/' covers only the overview, not every path", () => {
    expect(readRuleFor("/", matrix)?.path).toBe("/");
    expect(readRuleFor("/lots", matrix)).toBeNull();
  });

  it("refuses a path nobody listed, and a signed-out reader of anything but public pages", () => {
    expect(readersOf("/lots", matrix)).toEqual([]);
    expect(canRead("ADMIN", "/lots", matrix)).toBe(false);
    expect(canRead(null, "/balance", matrix)).toBe(false);
    expect(canRead(null, "/login", matrix)).toBe(true);
    expect(canRead("COMPLIANCE", "/balance/custody", matrix)).toBe(false);
    expect(canRead("ADMIN", "/balance/custody", matrix)).toBe(true);
  });

  it("draws each role's menu from the same rows", () => {
    expect(menuFor("COMPLIANCE", matrix)).toEqual([{ href: "/balance", label: "Balance" }]);
    expect(menuFor("COLLECTOR", matrix)).toEqual([]);
  });

  it("the real matrix keeps custody statements and customers from collectors and production", () => {
    for (const path of ["/balance", "/balance/custody", "/api/custody", "/shipments", "/periods"]) {
      expect(canRead("COLLECTOR", path)).toBe(false);
      expect(canRead("PRODUCTION", path)).toBe(false);
      expect(canRead("COMPLIANCE", path)).toBe(true);
    }
    expect(menuFor("COLLECTOR").map((m) => m.label)).toEqual(["Collect", "Pickups", "Sources", "Labels"]);
    expect(homeFor("COLLECTOR")).toBe("/collect");
    expect(homeFor("PRODUCTION")).toBe("/");
  });
});
