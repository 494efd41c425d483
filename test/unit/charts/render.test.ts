import { describe, expect, it } from "vitest";
import { renderPictureSvg } from "@/app/_ui/charts/render";

describe("pictures drawn on the server", () => {
  it("gives plain SVG with no script, no stylesheet, and names escaped", () => {
    const svg = renderPictureSvg(
      {
        legend: {},
        xAxis: { type: "category", data: ["a", "b"] },
        yAxis: { type: "value" },
        series: [{ name: "<script>alert(1)</script>", type: "bar", data: [1, 2] }],
      },
      { width: 400, height: 200 },
    );
    expect(svg.startsWith("<svg")).toBe(true);
    expect(svg).toContain('viewBox="0 0 400 200"');
    expect(svg).not.toMatch(/<script/i);
    expect(svg).not.toMatch(/<style/i);
    expect(svg).toContain("&lt;script&gt;");
  });

  it("draws a Sankey of a small flow without a loop", () => {
    const svg = renderPictureSvg(
      {
        series: [
          {
            type: "sankey",
            data: [{ name: "a" }, { name: "b" }, { name: "c" }],
            links: [
              { source: "a", target: "b", value: 3 },
              { source: "b", target: "c", value: 2 },
            ],
          },
        ],
      },
      { width: 400, height: 200 },
    );
    expect(svg.match(/<text/g)?.length).toBe(3);
  });
});
