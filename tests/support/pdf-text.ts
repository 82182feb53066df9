// Text of a PDF as an outside reader sees it: pdfjs-dist (Mozilla's PDF parser), one string per
// page, an item's end of line kept as "\n". Used by the tests that read sealed consents and receipts back.

/** Each page's text. */
export async function pdfPages(bytes: Uint8Array): Promise<string[]> {
  const pdfjs = await import("pdfjs-dist/legacy/build/pdf.mjs");
  const doc = await pdfjs.getDocument({ data: new Uint8Array(bytes), useSystemFonts: false, isEvalSupported: false }).promise;
  const pages: string[] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const content = await (await doc.getPage(i)).getTextContent();
    pages.push(content.items.map((item) => ("str" in item ? item.str + (item.hasEOL ? "\n" : " ") : "")).join(""));
  }
  await doc.destroy();
  return pages;
}

/** The whole document's text, pages separated by a line break. */
export async function pdfText(bytes: Uint8Array): Promise<string> {
  return (await pdfPages(bytes)).join("\n");
}
