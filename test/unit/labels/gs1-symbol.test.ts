import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import bwipjs from "bwip-js/node";
import { prepareZXingModule, readBarcodes } from "zxing-wasm/reader";
import { beforeAll, describe, expect, it } from "vitest";
import { gs1LabelElementString } from "@/lib/labels/gs1";
import { gs1DataMatrixOptions, gs1DataMatrixSvg } from "@/lib/labels/gs1-symbol";
import { gtinFor } from "@/lib/epcis/identifiers";
import { DeliveryLotSchema, LotFromPickupsSchema } from "@/lib/feedstock/lot.schema";

// The symbol is drawn by bwip-js and read back by a general-purpose decoder (zxing-wasm, ZXing C++
// compiled to WebAssembly), from the local wasm file so the test needs no network.
beforeAll(() => {
  const wasm = readFileSync(createRequire(import.meta.url).resolve("zxing-wasm/reader/zxing_reader.wasm"));
  void prepareZXingModule({
    overrides: { wasmBinary: wasm.buffer.slice(wasm.byteOffset, wasm.byteOffset + wasm.byteLength) as ArrayBuffer },
    fireImmediately: true,
  });
});

async function decode(elementString: string, withGtin: boolean) {
  const png = await bwipjs.toBuffer(
    gs1DataMatrixOptions(elementString, withGtin) as Parameters<typeof bwipjs.toBuffer>[0],
  );
  return readBarcodes(new Uint8Array(png), { formats: ["DataMatrix"], textMode: "HRI" });
}

describe("the GS1 DataMatrix on a lot label", () => {
  it.each([
    ["L-0042", null],
    ["LOT-2026/11.A_7", null],
    ["A".repeat(20), null],
    ["L-0042", gtinFor("0614141", "USED_COOKING_OIL")],
    ["T/2026-11", gtinFor("0614141", "TALLOW")],
  ])("carries lot %s (GTIN %s) as a scanner reads it", async (lot, gtin) => {
    const el = gs1LabelElementString(lot, gtin);
    if (!el.ok) throw new Error(el.issues[0]?.message);
    const [read, ...more] = await decode(el.value.elementString, el.value.withGtin);
    expect(more).toEqual([]);
    // GS1 General Specifications §5.6 (GS1 DataMatrix): symbology identifier ]d2 marks FNC1 in first position, i.e. GS1 data.
    expect(read?.symbologyIdentifier).toBe("]d2");
    expect(read?.contentType).toBe("GS1");
    // GS1 General Specifications §3.2, AI (10) batch/lot: the data field after "(10)" is the lot number itself.
    expect(read?.text).toBe(gtin === null ? `(10)${lot}` : `(01)${gtin}(10)${lot}`);
    expect(/\(10\)(.*)$/.exec(read?.text ?? "")?.[1]).toBe(lot);
  });

  it("draws an SVG for the label", () => {
    expect(gs1DataMatrixSvg("(10)L-0042", false)).toMatch(/^<svg [^>]*viewBox="0 0 \d+ \d+"/);
  });

  it("is refused for a GTIN that is not 14 digits", () => {
    expect(gs1LabelElementString("L-1", "123").ok).toBe(false);
  });
});

describe("a lot number that a GS1 symbol cannot carry is refused when the lot is made", () => {
  const pickups = {
    material: "USED_COOKING_OIL",
    receivedAt: "2026-11-02T08:00:00Z",
    observedVolumeL: 100,
    observedTempC: 20,
    pickupCodes: ["P-1"],
  };
  it("accepts 20 characters and refuses 21, naming the field and the rule (GS1 General Specifications, AI (10): X..20)", () => {
    expect(LotFromPickupsSchema.safeParse({ ...pickups, code: "L".repeat(20) }).success).toBe(true);
    const r = LotFromPickupsSchema.safeParse({ ...pickups, code: "L".repeat(21) });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.path).toEqual(["code"]);
    expect(r.error?.issues[0]?.message).toMatch(/^Lot number .* has 21 characters; GS1 AI \(10\) allows at most 20/);
  });

  it("applies to deliveries too", () => {
    const r = DeliveryLotSchema.safeParse({
      material: "TALLOW",
      receivedAt: "2026-11-02T08:00:00Z",
      observedVolumeL: 100,
      observedTempC: 20,
      supplierCode: "S-1",
      deliveryDocument: "D1",
      code: `D-${"9".repeat(30)}`,
    });
    expect(r.error?.issues.map((i) => i.path.join("."))).toEqual(["code"]);
  });
});
