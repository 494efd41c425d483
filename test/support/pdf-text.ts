// Reads back the text of a PDF the app wrote, page by page, the way a reader would extract it.
import path from "node:path";
import { getDocument } from "pdfjs-dist/legacy/build/pdf.mjs";

const FONTS = `${path.resolve("node_modules/pdfjs-dist/standard_fonts")}/`;

export async function pdfText(bytes: Uint8Array): Promise<string> {
  const doc = await getDocument({
    data: new Uint8Array(bytes),
    useSystemFonts: false,
    isEvalSupported: false,
    standardFontDataUrl: FONTS,
  }).promise;
  const pages: string[] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const content = await (await doc.getPage(i)).getTextContent();
    pages.push(
      content.items
        .map((item) => ("str" in item ? item.str : ""))
        .filter((s) => s !== "")
        .join(" "),
    );
  }
  await doc.destroy();
  return pages.join("\n");
}
