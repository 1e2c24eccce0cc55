/**
 * Shared cell styles for a workbook written by xlsx-populate, which gives every styled cell a cell format of its own
 * (with its own font, fill and border, the fill often empty). This rewrites xl/styles.xml so that identical fonts,
 * fills, borders and cell formats are stored once, every empty fill becomes the "no fill" pattern that readers
 * expect (an empty <fill/> is not valid SpreadsheetML and stops some readers), and points every cell, row and column
 * of the sheets at the shared format. Cell values, number formats and the look are unchanged.
 */
import JSZip from "jszip";

/** The child elements of a container such as <fonts>…</fonts>, as written. */
function children(xml: string, container: string, element: string): { whole: string; items: string[] } | null {
  const open = new RegExp(`<${container}\\b[^>]*?(/>|>([\\s\\S]*?)</${container}>)`).exec(xml);
  if (!open) return null;
  const inner = open[2] ?? "";
  const items = inner.match(new RegExp(`<${element}\\b[^>]*/>|<${element}\\b[^>]*>[\\s\\S]*?</${element}>`, "g")) ?? [];
  return { whole: open[0], items };
}

function container(name: string, items: string[], original: string): string {
  const attrs = (/^<\w+\b([^>]*?)\/?>/.exec(original)?.[1] ?? "").replace(/\s*count="\d+"/, "");
  return `<${name} count="${items.length}"${attrs}>${items.join("")}</${name}>`;
}

const NO_FILL = '<fill><patternFill patternType="none"/></fill>';

/** A fill with nothing in it (or an empty patternFill) is the "no fill" pattern. */
function normaliseFill(fill: string): string {
  if (/^<fill\b[^>]*\/>$/.test(fill) || /^<fill\b[^>]*>\s*<\/fill>$/.test(fill) || /^<fill\b[^>]*>\s*<patternFill\s*\/>\s*<\/fill>$/.test(fill)) return NO_FILL;
  return fill;
}

/** Store each distinct item once; returns the kept items and the old index → new index map. */
function dedupe(items: string[], keepFirst = 0): { kept: string[]; map: number[] } {
  const kept: string[] = [];
  const index = new Map<string, number>();
  const map = items.map((item, i) => {
    if (i < keepFirst) {
      kept.push(item);
      if (!index.has(item)) index.set(item, kept.length - 1);
      return kept.length - 1;
    }
    const at = index.get(item);
    if (at !== undefined) return at;
    kept.push(item);
    index.set(item, kept.length - 1);
    return kept.length - 1;
  });
  return { kept, map };
}

function remapAttribute(xml: string, attribute: string, map: readonly number[]): string {
  return xml.replace(new RegExp(`\\b${attribute}="(\\d+)"`), (_m, n: string) => `${attribute}="${map[Number(n)] ?? 0}"`);
}

/** The styles part with shared formats, and the map from old to new cell format index. */
export function shareStyles(stylesXml: string): { xml: string; xfMap: number[] } {
  let xml = stylesXml;
  const fonts = children(xml, "fonts", "font");
  const fills = children(xml, "fills", "fill");
  const borders = children(xml, "borders", "border");
  const cellXfs = children(xml, "cellXfs", "xf");
  if (!fonts || !fills || !borders || !cellXfs) return { xml, xfMap: [] };

  const font = dedupe(fonts.items);
  // SpreadsheetML reserves the first two fills (none, gray125): kept in place
  const fill = dedupe(fills.items.map(normaliseFill), 2);
  const border = dedupe(borders.items);
  const remap = (xf: string) => remapAttribute(remapAttribute(remapAttribute(xf, "fontId", font.map), "fillId", fill.map), "borderId", border.map);
  const xf = dedupe(cellXfs.items.map(remap));

  xml = xml.replace(fonts.whole, container("fonts", font.kept, fonts.whole));
  xml = xml.replace(fills.whole, container("fills", fill.kept, fills.whole));
  xml = xml.replace(borders.whole, container("borders", border.kept, borders.whole));
  const styleXfs = children(xml, "cellStyleXfs", "xf");
  if (styleXfs) xml = xml.replace(styleXfs.whole, container("cellStyleXfs", styleXfs.items.map(remap), styleXfs.whole));
  xml = xml.replace(children(xml, "cellXfs", "xf")!.whole, container("cellXfs", xf.kept, cellXfs.whole));
  return { xml, xfMap: xf.map };
}

/** A sheet part with its cells', rows' and columns' format indexes mapped to the shared ones. */
export function remapSheet(sheetXml: string, xfMap: readonly number[]): string {
  const to = (n: string) => String(xfMap[Number(n)] ?? 0);
  return sheetXml
    .replace(/<c\b[^>]*>/g, (tag) => tag.replace(/\ss="(\d+)"/, (_m, n: string) => ` s="${to(n)}"`))
    .replace(/<row\b[^>]*>/g, (tag) => tag.replace(/\ss="(\d+)"/, (_m, n: string) => ` s="${to(n)}"`))
    .replace(/<col\b[^>]*>/g, (tag) => tag.replace(/\sstyle="(\d+)"/, (_m, n: string) => ` style="${to(n)}"`));
}

/** A workbook's bytes with shared cell styles (see the module comment). */
export async function withSharedStyles(bytes: Uint8Array): Promise<Buffer> {
  const zip = await JSZip.loadAsync(bytes);
  const styles = zip.file("xl/styles.xml");
  if (!styles) return Buffer.from(bytes);
  const { xml, xfMap } = shareStyles(await styles.async("string"));
  zip.file("xl/styles.xml", xml);
  for (const name of Object.keys(zip.files).filter((n) => /^xl\/worksheets\/[^/]+\.xml$/.test(n))) {
    zip.file(name, remapSheet(await zip.file(name)!.async("string"), xfMap));
  }
  return zip.generateAsync({ type: "nodebuffer", compression: "DEFLATE", compressionOptions: { level: 6 } });
}
