import JSZip from "jszip";
import { describe, expect, it } from "vitest";
import { DRAFT_CAUTION } from "@/app/_components/draft-caution";
import { buildWordPack } from "@/reports/docx/filing-pack";
import { varPnlChart, volatilityChart } from "@/reports/charts";
import { STYLE } from "@/reports/docx/styles";
import { formatAmount, formatConfidence, formatDate, formatNumber, formatPValue, formatPercent } from "@/reports/format";
import { filingSections } from "@/reports/sections";
import { FORMULA_TEXT, packsBuiltBeforeAll } from "./fixture";

interface Unpacked {
  zip: JSZip;
  document: string;
  headers: string[];
  footers: string[];
  styles: string;
  settings: string;
}

async function unpack(bytes: Buffer): Promise<Unpacked> {
  const zip = await JSZip.loadAsync(bytes);
  const read = (name: string) => zip.file(name)!.async("string");
  const names = Object.keys(zip.files);
  return {
    zip,
    document: await read("word/document.xml"),
    headers: await Promise.all(names.filter((n) => /^word\/header\d*\.xml$/.test(n)).map(read)),
    footers: await Promise.all(names.filter((n) => /^word\/footer\d*\.xml$/.test(n)).map(read)),
    styles: await read("word/styles.xml"),
    settings: await read("word/settings.xml"),
  };
}

function decode(text: string): string {
  return text.replace(/&lt;/g, "<").replace(/&gt;/g, ">").replace(/&quot;/g, '"').replace(/&apos;/g, "'").replace(/&amp;/g, "&");
}

/** The text of an XML fragment's runs, tabs as "\t". */
function textOf(xml: string): string {
  return decode([...xml.matchAll(/<w:t(?:\s[^>]*)?>([^<]*)<\/w:t>|<w:tab\/>/g)].map((m) => (m[1] !== undefined ? m[1] : "\t")).join(""));
}

/** Paragraphs outside tables with their style. */
function paragraphs(xml: string): { style: string | null; text: string }[] {
  const body = xml.replace(/<w:tbl>[\s\S]*?<\/w:tbl>/g, "");
  return [...body.matchAll(/<w:p(?:\s[^>]*)?>([\s\S]*?)<\/w:p>/g)].map((m) => ({ style: /<w:pStyle w:val="([^"]+)"\/>/.exec(m[1])?.[1] ?? null, text: textOf(m[1]) }));
}

/** Every table as rows of cell texts. */
function tables(xml: string): string[][][] {
  return [...xml.matchAll(/<w:tbl>([\s\S]*?)<\/w:tbl>/g)].map((t) =>
    [...t[1].matchAll(/<w:tr(?:\s[^>]*)?>([\s\S]*?)<\/w:tr>/g)].map((r) => [...r[1].matchAll(/<w:tc>([\s\S]*?)<\/w:tc>/g)].map((c) => textOf(c[1]))),
  );
}

function tableStartingWith(all: string[][][], header: string): string[][] {
  const t = all.find((x) => x[0]?.[0] === header);
  if (!t) throw new Error(`no table whose first header is "${header}"`);
  return t;
}

const packs = packsBuiltBeforeAll(buildWordPack, unpack);

describe("the Word pack", () => {
  it("has every section, each heading styled once as a heading", () => {
    const paras = paragraphs(packs.draft.document);
    for (const s of filingSections(packs.vm)) {
      const style = s.id === "cover" ? STYLE.coverTitle : "Heading1";
      expect(paras.filter((p) => p.style === style && p.text === s.title), s.title).toHaveLength(1);
    }
    for (const id of Object.values(STYLE)) expect(packs.draft.styles.match(new RegExp(`w:styleId="${id}"`, "g")), id).toHaveLength(1);
  });

  it("shows the capital with every term, and VaR and ES by method, confidence and asset class, with units", () => {
    const all = tables(packs.draft.document);
    const f = packs.vm.figures;
    const c = f.capital;
    const capital = tableStartingWith(all, "Term");
    expect(capital[0]).toEqual(["Term", "Value", "Unit"]);
    expect(capital.slice(1).map((r) => r[1])).toEqual([
      formatAmount(c.varLast), formatAmount(c.varAverage), `${formatNumber(c.multiplierBase, 2)} + ${formatNumber(c.plusFactor, 2)} = ${formatNumber(c.multiplier, 2)}`, formatAmount(c.varTerm),
      formatAmount(c.stressedVarLast!), formatAmount(c.stressedVarAverage!), formatNumber(c.stressedMultiplier!, 2), formatAmount(c.stressedVarTerm), formatAmount(c.capital),
    ]);
    expect(capital.at(-1)).toEqual(["Capital", formatAmount(c.capital), "EUR"]);

    const totals = tableStartingWith(all, "Method");
    expect(totals[0]).toEqual(["Method", "Confidence", "VaR, 1 day (EUR)", "ES, 1 day (EUR)", "VaR, 10 days (EUR)", "ES, 10 days (EUR)"]);
    expect(totals.slice(1)).toEqual(
      f.totals.flatMap((m) => m.byConfidence.map((x) => [`${m.label}${m.primary ? " (primary)" : ""}`, formatConfidence(x.confidence), formatAmount(x.oneDay.var), formatAmount(x.oneDay.es), formatAmount(x.horizon.var), formatAmount(x.horizon.es)])),
    );

    const byClass = all.filter((t) => t[0][0] === "Asset class" && t[0][1].startsWith("Component VaR"));
    expect(byClass).toHaveLength(f.byAssetClass.length);
    byClass.forEach((t, k) => {
      f.byAssetClass[k].rows.forEach((row, i) => expect(t[1 + i]).toEqual([row.label, formatAmount(row.componentVar1d), formatAmount(row.componentEs1d), formatAmount(row.componentVarHorizon), formatAmount(row.componentEsHorizon), formatAmount(row.standAloneVar1d), formatAmount(row.standAloneVarHorizon)]));
      expect(t.at(-1)![0]).toBe("Diversification benefit");
    });

    const stressed = tableStartingWith(all, "Confidence");
    expect(stressed.slice(1)).toEqual(f.stressed.byConfidence.map((x) => [formatConfidence(x.confidence), formatAmount(x.oneDay.var), formatAmount(x.oneDay.es), formatAmount(x.horizon.var), formatAmount(x.horizon.es)]));
  });

  it("shows the backtest tests and every exception with its explanation", () => {
    const all = tables(packs.draft.document);
    const b = packs.vm.figures.backtest;
    const tests = tableStartingWith(all, "Measure");
    expect(tests).toContainEqual(["Kupiec, likelihood ratio", formatNumber(b.kupiec.lr, 3), `p-value ${formatPValue(b.kupiec.pValue)}`]);
    expect(tests).toContainEqual(["Zone and plus factor", `${b.zone}, ${formatNumber(b.plusFactor, 2)}`, `cumulative probability ${formatNumber(b.cumulativeProbability, 4)}`]);
    const exceptions = tableStartingWith(all, "Date");
    expect(exceptions.slice(1)).toEqual(b.exceptionList.map((e) => [formatDate(e.date), formatAmount(e.pnl), formatAmount(e.var), formatAmount(e.excess), `'${e.explanation}`]));
  });

  it("lists the positions, risk factors, correlation, contributions and VaR history", () => {
    const all = tables(packs.draft.document);
    const f = packs.vm.figures;
    const positions = tableStartingWith(all, "Instrument");
    expect(positions.slice(1).map((r) => [r[0], r[3], r[5]])).toEqual(f.positions.map((p) => [p.instrument, formatAmount(p.marketValue), p.componentVar1d === null ? "—" : formatAmount(p.componentVar1d)]));
    const factors = tableStartingWith(all, "Factor");
    expect(factors.slice(1).map((r) => r.slice(3, 7))).toEqual(f.riskFactors.map((r) => r.estimates.map((e) => formatPercent(e.volatility!, 3).replace(" %", ""))));
    const corr = all.find((t) => t[0][0] === "" && t[0][1] === f.correlation!.factors[0])!;
    expect(corr.slice(1).map((r) => r.slice(1))).toEqual(f.correlation!.matrix.map((row) => row.map((v) => formatNumber(v, 2))));
    const currency = tableStartingWith(all, "Currency");
    const set = f.contributions.find((c) => c.confidence === f.capitalConfidence)!;
    expect(currency.slice(1, -1).map((r) => [r[0], r[1]])).toEqual(set.byCurrency.map((g) => [g.currency, formatAmount(g.componentVar1d)]));
    const history = tableStartingWith(all, "Data to");
    expect(history.slice(1).map((r) => r.slice(0, 1 + f.confidences.length))).toEqual(f.varHistory.points.map((p) => [formatDate(p.asOf), ...p.var1d.map(formatAmount)]));
  });

  it("carries the caution in the body and in the footer, with the firm, the period and page numbers on every page", () => {
    const paras = paragraphs(packs.draft.document);
    expect(paras.filter((p) => p.style === STYLE.caution && p.text.includes(DRAFT_CAUTION)).length).toBeGreaterThanOrEqual(2);
    expect(packs.draft.footers).toHaveLength(1);
    const footer = packs.draft.footers[0];
    expect(textOf(footer)).toContain(`Draft caution: ${DRAFT_CAUTION}`);
    expect(textOf(footer)).toContain(`Northmoor Brokerage Ltd · reporting period ending ${formatDate(packs.vm.period.end)} · version 2`);
    expect(footer).toMatch(/<w:instrText[^>]*>\s*PAGE\s*<\/w:instrText>/);
    expect(footer).toMatch(/<w:instrText[^>]*>\s*NUMPAGES\s*<\/w:instrText>/);
  });

  it("marks every page DRAFT until signed: one default header for the only section, no first-page or even-page variant", () => {
    expect(packs.draft.headers).toHaveLength(1);
    expect(textOf(packs.draft.headers[0])).toContain("DRAFT — NOT SIGNED");
    const sections = packs.draft.document.match(/<w:sectPr[\s\S]*?<\/w:sectPr>/g)!;
    expect(sections).toHaveLength(1);
    expect(sections[0]).toMatch(/<w:headerReference w:type="default"/);
    expect(sections[0]).toMatch(/<w:footerReference w:type="default"/);
    expect(sections[0]).not.toMatch(/w:titlePg|w:type="first"|w:type="even"/);
    expect(packs.draft.settings).not.toMatch(/<w:evenAndOddHeaders(?! w:val="false")/);
    const signOff = tables(packs.draft.document).filter((t) => t[1]?.[0] === "Signed by").at(-1)!;
    expect(signOff.slice(1)).toEqual([["Signed by", "—"], ["Registration no.", "—"], ["Signed at", "—"], ["Content hash (SHA-256)", "Filled in when the filing is signed"]]);
    expect(textOf(packs.draft.document)).toContain("Not signed. This version is a draft until the compliance head signs it in Ballast.");
  });

  it("once signed, fills the sign-off block with the signer and the content hash, and drops the DRAFT marking", () => {
    const hash = packs.signedVm.signOff!.contentHash;
    expect(textOf(packs.signed.headers[0])).toMatch(new RegExp(`^SIGNED by Helen Marsh on 3 Dec 2026 · SHA-256 ${hash.slice(0, 12)}…`));
    for (const part of [packs.signed.document, ...packs.signed.headers, ...packs.signed.footers]) expect(textOf(part)).not.toContain("DRAFT — NOT SIGNED");
    const signOff = tables(packs.signed.document).filter((t) => t[1]?.[0] === "Signed by").at(-1)!;
    expect(signOff.slice(1)).toEqual([["Signed by", "Helen Marsh"], ["Registration no.", "FMA-CO-20931"], ["Signed at", "2026-12-03 15:42 UTC"], ["Content hash (SHA-256)", hash]]);
    const paras = paragraphs(packs.signed.document);
    expect(paras.some((p) => p.style === STYLE.hash && p.text === hash)).toBe(true);
    expect(paras.some((p) => p.text.startsWith("Version 1: signed by Helen Marsh (FMA-CO-20931) on 2026-12-02 11:05 UTC") && p.text.endsWith("Explanations were missing."))).toBe(true);
  });

  it("embeds the two charts as PNG images with alternative text, or leaves them out when asked", async () => {
    const media = Object.keys(packs.draft.zip.files).filter((n) => n.startsWith("word/media/"));
    expect(media).toHaveLength(2);
    // IHDR width and height: each chart at its own pixel size (the volatility chart grows with its labels)
    const sizes = [volatilityChart(packs.vm)!, varPnlChart(packs.vm)!].map((c) => [c.width, c.height]);
    for (const name of media) {
      const png = await packs.draft.zip.file(name)!.async("nodebuffer");
      expect(png.subarray(0, 8).toString("hex")).toBe("89504e470d0a1a0a"); // PNG signature (PNG specification, 5.2)
      expect(sizes).toContainEqual([png.readUInt32BE(16), png.readUInt32BE(20)]);
    }
    expect(packs.draft.document).toContain('descr="One-day volatility of each risk factor by estimator (%).');
    expect(packs.draft.document).toContain(`descr="Daily P&amp;L against the one-day VaR at 99 % (EUR), ${packs.vm.figures.backtest.pnlVsVar.length} days`);
    const plain = await unpack(await buildWordPack(packs.vm, { charts: false }));
    expect(Object.keys(plain.zip.files).filter((n) => n.startsWith("word/media/"))).toHaveLength(0);
  });

  it("shows formula-looking text as the workbook does: prefixed where it begins a cell or a line", () => {
    const all = tables(packs.draft.document);
    const quality = tableStartingWith(all, "Severity");
    expect(quality.some((r) => r[2] === `'${FORMULA_TEXT}` && r[3] === `'${FORMULA_TEXT} has no price history.`)).toBe(true);
    const paras = paragraphs(packs.draft.document);
    expect(paras.some((p) => p.text === `'${FORMULA_TEXT} was found in the positions file and is listed as left out.`)).toBe(true);
  });

  it("refuses to build a signed pack whose content differs from what was signed", async () => {
    const changed = structuredClone(packs.signedVm);
    changed.figures.backtest.exceptionList[0].explanation = "Changed after signing.";
    await expect(buildWordPack(changed)).rejects.toThrow("does not match this filing's content");
  });
});
