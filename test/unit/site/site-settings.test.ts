import { describe, expect, it } from "vitest";
import { SiteGs1Schema } from "@/lib/site/site-settings.schema";

describe("the site's GS1 Company Prefix", () => {
  it.each([
    ["0614141", "0614141"], // GS1 EPC Tag Data Standard example prefix (7 digits)
    [" 950600 ", "950600"],
    ["", null],
  ])("accepts %j", (typed, saved) => {
    expect(SiteGs1Schema.parse({ gs1CompanyPrefix: typed, reason: "licence received" }).gs1CompanyPrefix).toBe(saved);
  });

  it.each(["12345", "12345678901", "06141A1", "0614-141"])("refuses %j, naming the field", (typed) => {
    const r = SiteGs1Schema.safeParse({ gs1CompanyPrefix: typed, reason: "licence received" });
    expect(r.error?.issues.map((i) => [i.path.join("."), i.message])).toEqual([
      ["gs1CompanyPrefix", expect.stringMatching(/^GS1 Company Prefix: 6 to 10 digits/) as string],
    ]);
  });

  it("needs a reason", () => {
    expect(SiteGs1Schema.safeParse({ gs1CompanyPrefix: "0614141", reason: "" }).error?.issues[0]?.path).toEqual([
      "reason",
    ]);
  });
});
