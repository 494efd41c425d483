// GS1 DataMatrix symbols drawn by bwip-js (Barcode Writer in Pure PostScript) on the server.
import bwipjs from "bwip-js/node";

/**
 * Options shared by the label (SVG) and the test's decode (PNG). `dontlint` lets a lot be printed with
 * AI (10) alone when the plant has no GTIN: bwip-js otherwise refuses (10) without (01), per the GS1
 * mandatory-association rule; the characters and length were already checked by gs1LotElement.
 */
export function gs1DataMatrixOptions(elementString: string, withGtin: boolean) {
  return {
    bcid: "gs1datamatrix",
    text: elementString,
    scale: 3,
    padding: 2,
    backgroundcolor: "FFFFFF",
    ...(withGtin ? {} : { dontlint: true }),
  };
}

/** An SVG GS1 DataMatrix for the element string, e.g. "(01)00614141000012(10)L-0042". */
export function gs1DataMatrixSvg(elementString: string, withGtin: boolean): string {
  return bwipjs.toSVG(gs1DataMatrixOptions(elementString, withGtin));
}
