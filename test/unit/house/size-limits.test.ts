// The size limits of the engineers' map: no file in lib/ or app/ over 400 lines, no function over 80
// lines, except generated code, data tables and the exceptions in size-baseline.json — each recorded
// with the size it had when the rule came in, which it may not grow past (shrink it, lower the figure).
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import baseline from "./size-baseline.json";
import { files, functionsOf, lineCount, MAX_FILE_LINES, MAX_FUNCTION_LINES, ROOT } from "./sizes";

const fileBaseline: Record<string, number> = baseline.files;
const functionBaseline: Record<string, number> = baseline.functions;

describe("size limits", () => {
  it(`files in lib/ and app/ stay within ${MAX_FILE_LINES} lines (or their recorded size)`, () => {
    const over = files
      .map((f) => ({ f, n: lineCount(readFileSync(join(ROOT, f), "utf8")) }))
      .filter(({ f, n }) => n > Math.max(MAX_FILE_LINES, fileBaseline[f] ?? 0))
      .map(({ f, n }) => `${f}: ${n} lines`);
    expect(over).toEqual([]);
  });

  it(`functions stay within ${MAX_FUNCTION_LINES} lines (or their recorded size)`, () => {
    const over = files.flatMap((f) =>
      functionsOf(f, readFileSync(join(ROOT, f), "utf8"))
        .filter((fn) => fn.lines > Math.max(MAX_FUNCTION_LINES, functionBaseline[`${f}#${fn.name}`] ?? 0))
        .map((fn) => `${f}#${fn.name}: ${fn.lines} lines`),
    );
    expect(over).toEqual([]);
  }, 120_000); // parses every source file

  it("every recorded exception still exists and is still over the limit (a shrunk one leaves the list)", () => {
    const stale = Object.entries(fileBaseline)
      .filter(([f]) => !files.includes(f) || lineCount(readFileSync(join(ROOT, f), "utf8")) <= MAX_FILE_LINES)
      .map(([f]) => f);
    expect(stale).toEqual([]);
  });
});
