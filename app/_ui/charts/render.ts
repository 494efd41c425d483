import "server-only";
// Pictures are drawn on the server into plain SVG (docs/decisions/0033-pictures-are-svg-drawn-on-the-server.md):
// no chart script reaches the browser, so the page's script policy is untouched and the picture shows
// before any script runs. Only the parts of the charting library we use are registered.
import * as echarts from "echarts/core";
import { BarChart, LineChart, SankeyChart, ScatterChart } from "echarts/charts";
import { GridComponent, LegendComponent, MarkLineComponent } from "echarts/components";
import { SVGRenderer } from "echarts/renderers";
import type { EChartsCoreOption } from "echarts/core";

echarts.use([
  BarChart,
  LineChart,
  SankeyChart,
  ScatterChart,
  GridComponent,
  LegendComponent,
  MarkLineComponent,
  SVGRenderer,
]);

export const PICTURE_WIDTH = 760;

/**
 * Colours safe for the common colour-vision deficiencies, in a fixed order so a material keeps its
 * colour from picture to picture (Okabe & Ito, "Color Universal Design", 2008; black left out).
 */
export const PALETTE = [
  "#0072B2",
  "#E69F00",
  "#009E73",
  "#CC79A7",
  "#56B4E9",
  "#D55E00",
  "#F0E442",
  "#7a7a7a",
] as const;

export const TEXT_STYLE = { fontFamily: "system-ui, sans-serif", fontSize: 12, color: "#1c211f" } as const;

/** The SVG markup of one picture. The library's hover stylesheet is left out: the picture is not interactive. */
export function renderPictureSvg(option: EChartsCoreOption, size: { width?: number; height: number }): string {
  const chart = echarts.init(null, null, {
    renderer: "svg",
    ssr: true,
    width: size.width ?? PICTURE_WIDTH,
    height: size.height,
  });
  try {
    chart.setOption({
      animation: false,
      color: [...PALETTE],
      textStyle: TEXT_STYLE,
      aria: { enabled: false },
      ...option,
    });
    return chart.renderToSVGString().replace(/<style\b[^>]*>[\s\S]*?<\/style>/g, "");
  } finally {
    chart.dispose();
  }
}
