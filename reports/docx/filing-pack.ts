/**
 * The Word filing pack: every section of the filing from the view model, styled once (./styles), tables with their
 * units, the charts as PNG images, a header with the DRAFT marking on every page until the filing is signed (then
 * the signer and the content hash), and a footer with the firm, the period, the draft caution and the page number.
 * Pure apart from reading the text templates: `buildWordPack(vm)` → the .docx bytes.
 */
import {
  BorderStyle,
  Document,
  Footer,
  Header,
  ImageRun,
  LineRuleType,
  Packer,
  PageNumber,
  Paragraph,
  ShadingType,
  Table,
  TableCell,
  TableLayoutType,
  TableRow,
  TabStopType,
  TextRun,
  WidthType,
  type ParagraphChild,
} from "docx";
import { contentHash, FILING_STATUS_LABELS, VAR_METHOD_LABELS, type FilingViewModel } from "../view-model";
import { filingSections, statusMarking, type Block, type Section } from "../sections";
import { CAPITAL_TABLE_COLUMNS, capitalTableRows } from "../capital-table";
import {
  backtestTable,
  componentCells,
  coverTable,
  dataQualityTable,
  exceptionsTable,
  runRecordTable,
  signOffTable,
  stressedTable,
  totalsTable,
  varEsCells,
  varEsColumns,
  type FilingTable,
  type FilingTableColumn,
} from "../filing-tables";
import { formatAmount, formatConfidence, formatDate, formatNumber, formatPValue, formatPercent } from "../format";
import { neutralise } from "../neutralise";
import { renderPng, varPnlChart, volatilityChart, type Chart } from "../charts";
import { COLOURS, filingStyles, STYLE } from "./styles";

/** A4 portrait with 2 cm margins: the body is 17 cm wide. */
const PAGE = { width: 11906, height: 16838, margin: 1134 };
const BODY_TWIPS = PAGE.width - 2 * PAGE.margin;
/** Pixels (96 to the inch) across the body, for images. */
const BODY_PX = Math.floor((BODY_TWIPS / 1440) * 96);
/** Above this many factors the correlation matrix is left to the workbook. */
export const CORRELATION_WORD_MAX = 14;

export interface WordPackOptions {
  /** draw the charts (default true); without them the tables carry the same figures */
  charts?: boolean;
}

type FileChild = Paragraph | Table;

const thin = { style: BorderStyle.SINGLE, size: 4, color: COLOURS.line };
const none = { style: BorderStyle.NONE, size: 0, color: "FFFFFF" };

function cellParagraph(text: string, style: string, bold = false): Paragraph {
  return new Paragraph({ style, children: [new TextRun({ text, bold: bold || undefined })] });
}

/** A table with a repeated header row, light rules, numbers right-aligned; `totalRows` are shaded and bold. */
function table(columns: FilingTableColumn[], rows: string[][], options: { totalRows?: number[]; caption?: string } = {}): FileChild[] {
  const weights = columns.map((c) => c.weight ?? 1);
  const sum = weights.reduce((a, b) => a + b, 0);
  const widths = weights.map((w) => Math.floor((w / sum) * BODY_TWIPS));
  const header = new TableRow({
    tableHeader: true,
    cantSplit: true,
    keepNext: true,
    children: columns.map(
      (c, i) =>
        new TableCell({
          width: { size: widths[i], type: WidthType.DXA },
          shading: { type: ShadingType.CLEAR, color: "auto", fill: COLOURS.headerFill },
          children: [cellParagraph(c.header, c.numeric ? STYLE.tableHeaderNumber : STYLE.tableHeader)],
        }),
    ),
  });
  // a short table stays on one page (every row kept with the next); a long one breaks between rows, its header repeated
  const keepTogether = rows.length <= 16;
  const body = rows.map((row, r) => {
    const total = options.totalRows?.includes(r) ?? false;
    return new TableRow({
      cantSplit: true,
      keepNext: keepTogether && r < rows.length - 1 ? true : undefined,
      children: row.map(
        (text, i) =>
          new TableCell({
            width: { size: widths[i], type: WidthType.DXA },
            shading: total ? { type: ShadingType.CLEAR, color: "auto", fill: COLOURS.totalFill } : undefined,
            children: [cellParagraph(text, columns[i]?.numeric ? STYLE.tableNumber : STYLE.tableText, total)],
          }),
      ),
    });
  });
  const out: FileChild[] = [];
  if (options.caption) out.push(new Paragraph({ style: STYLE.caption, text: options.caption }));
  out.push(
    new Table({
      rows: [header, ...body],
      width: { size: BODY_TWIPS, type: WidthType.DXA },
      columnWidths: widths,
      layout: TableLayoutType.FIXED,
      borders: { top: thin, bottom: thin, left: none, right: none, insideHorizontal: thin, insideVertical: none },
      margins: { top: 30, bottom: 30, left: 70, right: 70 },
    }),
  );
  out.push(new Paragraph({ text: "", spacing: { after: 80 } }));
  return out;
}

/** A table both the page and the pack draw (../filing-tables), without the page's caption. */
function shared({ columns, rows, totalRows }: FilingTable): FileChild[] {
  return table(columns, rows, { totalRows });
}

function blockParagraph(b: Exclude<Block, { kind: "table" | "chart" }>, section: Section, first: boolean, beforeFigure: boolean): Paragraph {
  // a paragraph that introduces a table or chart stays on its page
  const keepNext = beforeFigure || undefined;
  switch (b.kind) {
    case "h1":
      return new Paragraph({ heading: "Heading1", text: b.text, pageBreakBefore: first && (section.appendix ? section.id === "positions" : section.id !== "cover") ? true : undefined });
    case "h2":
      return new Paragraph({ heading: "Heading2", text: b.text });
    case "bullet":
      return new Paragraph({ text: b.text, bullet: { level: 0 }, keepNext });
    case "note":
      return new Paragraph({ style: STYLE.note, text: b.text, keepNext });
    case "p":
      return new Paragraph({ text: b.text, keepNext });
  }
}

/** Every table the templates name, by slot name. */
function tables(vm: FilingViewModel): Record<string, () => FileChild[]> {
  const f = vm.figures;
  const ccy = f.currency;
  const H = f.horizonDays;
  const a = formatAmount;
  const t = (s: string) => neutralise(s);
  const capConf = f.capitalConfidence;
  return {
    cover: () => {
      const { columns, rows } = coverTable(vm, FILING_STATUS_LABELS[vm.filing.status]);
      const filed = vm.filing.filedAt ? [["Filed", `${formatDate(vm.filing.filedAt)}${vm.filing.filingReference ? `, regulator's reference ${vm.filing.filingReference}` : ""}`]] : [];
      return table(columns, [...rows, ...filed]);
    },
    capital: () => {
      const { rows, totalRows } = capitalTableRows(f.capital, ccy);
      return table([...CAPITAL_TABLE_COLUMNS], rows, { totalRows });
    },
    totals: () => shared(totalsTable(f)),
    "asset-classes": () =>
      f.byAssetClass.flatMap((set) => {
        const total = f.totals.find((m) => m.primary)!.byConfidence.find((c) => c.confidence === set.confidence)!;
        const rows = set.rows.map((r) => [r.label, ...componentCells(r), a(r.standAloneVar1d), a(r.standAloneVarHorizon)]);
        rows.push(["Book total", ...varEsCells(total), a(set.rows.reduce((s, r) => s + r.standAloneVar1d, 0)), a(set.rows.reduce((s, r) => s + r.standAloneVarHorizon, 0))]);
        rows.push(["Diversification benefit", "", "", "", "", a(total.diversificationBenefit1d), a(total.diversificationBenefitHorizon)]);
        return table(
          [
            { header: "Asset class", weight: 2 },
            ...varEsColumns("Component ", ccy, H),
            { header: `Stand-alone VaR, 1 day (${ccy})`, numeric: true },
            { header: `Stand-alone VaR, ${H} days (${ccy})`, numeric: true },
          ],
          rows,
          { caption: `At ${formatConfidence(set.confidence)} confidence, ${VAR_METHOD_LABELS[f.primaryMethod].toLowerCase()}`, totalRows: [rows.length - 2, rows.length - 1] },
        );
      }),
    stressed: () => shared(stressedTable(f)),
    "backtest-tests": () => shared(backtestTable(f.backtest)),
    exceptions: () => (f.backtest.exceptionList.length ? shared(exceptionsTable(f, (e) => (e.explanation ? t(e.explanation) : "No explanation given."))) : []),
    "method-models": () =>
      vm.method.models?.length
        ? table(
            [{ header: "Factor", weight: 1.1 }, { header: "Chosen by", weight: 1.2 }, { header: "Model used", weight: 2.2 }, { header: "Parameters", weight: 2.2 }, { header: "1-day volatility", numeric: true, weight: 1 }],
            vm.method.models.map((m) => [m.factor, `${m.source}${m.assetClass ? ` (${m.assetClass})` : ""}`, m.label, m.parameters || "—", `${formatNumber(m.volatility * 100, 3)} %`]),
          )
        : [],
    "method-candidates": () =>
      vm.method.candidates?.rows.length
        ? table(
            [
              { header: "Method", weight: 2.6 },
              { header: "Exceptions", numeric: true, weight: 0.9 },
              { header: "Zone", weight: 0.8 },
              { header: "Kupiec p", numeric: true, weight: 0.9 },
              { header: "Christoffersen p", numeric: true, weight: 1 },
              { header: `Mean VaR (${ccy})`, numeric: true, weight: 1.2 },
              { header: `Capital (${ccy})`, numeric: true, weight: 1.2 },
            ],
            vm.method.candidates.rows.map((r) =>
              r.error
                ? [r.label, "—", "—", "—", "—", "—", `not computed: ${r.error}`]
                : [r.label, String(r.exceptions ?? "—"), r.zone ?? "—", r.kupiecPValue === null ? "—" : formatPValue(r.kupiecPValue), r.christoffersenPValue === null ? "—" : formatPValue(r.christoffersenPValue), r.meanVar === null ? "—" : a(r.meanVar), r.capital === null ? "—" : a(r.capital)],
            ),
          )
        : [],
    "run-record": () => shared(runRecordTable(vm, (h) => h.hash)),
    "data-quality": () => (vm.dataQuality.items.length ? shared(dataQualityTable(vm, t)) : []),
    "sign-off": () => shared(signOffTable(vm, (hash) => hash)),
    positions: () =>
      table(
        [
          { header: "Instrument", weight: 1.5 },
          { header: "Asset class", weight: 1.5 },
          { header: "Currency", weight: 0.95 },
          { header: `Market value (${ccy})`, numeric: true, weight: 1.3 },
          { header: `Exposure (${ccy})`, numeric: true, weight: 1.3 },
          { header: `VaR contribution, 1 day (${ccy})`, numeric: true, weight: 1.3 },
          { header: "Note", weight: 1.6 },
        ],
        f.positions.map((p) => [t(p.instrument), p.assetClassLabel, p.currency, a(p.marketValue), p.exposure === null ? "—" : a(p.exposure), p.componentVar1d === null ? "—" : a(p.componentVar1d), p.included ? "" : `Left out: ${t(p.note)}`]),
      ),
    "risk-factors": () => {
      const estimators: { id: string; label: string }[] = [];
      for (const r of f.riskFactors) for (const e of r.estimates) if (!estimators.some((x) => x.id === e.estimator)) estimators.push({ id: e.estimator, label: e.label });
      return table(
        [
          { header: "Factor", weight: 1.3 },
          { header: "Kind", weight: 1.1 },
          { header: `Exposure (${ccy})`, numeric: true, weight: 1.3 },
          ...estimators.map((e) => ({ header: `${e.label}, 1 day (%)`, numeric: true, weight: 1.1 })),
          { header: "Chosen", weight: 1.3 },
        ],
        f.riskFactors.map((r) => [
          t(r.factor),
          r.kind,
          a(r.exposure),
          ...estimators.map((e) => {
            const v = r.estimates.find((x) => x.estimator === e.id)?.volatility;
            return v === undefined || v === null ? "—" : formatPercent(v, 3).replace(" %", "");
          }),
          r.chosenLabel ?? "—",
        ]),
      );
    },
    correlation: () => {
      const c = f.correlation;
      if (!c) return [];
      if (c.factors.length > CORRELATION_WORD_MAX) return [new Paragraph({ text: `The matrix has ${c.factors.length} factors; it is in the spreadsheet pack's Correlation sheet.` })];
      return table(
        [{ header: "", weight: 1.4 }, ...c.factors.map((x) => ({ header: t(x), numeric: true, weight: 1 }))],
        c.matrix.map((row, i) => [t(c.factors[i]), ...row.map((v) => formatNumber(v, 2))]),
      );
    },
    "contributions-currency": () => {
      const set = f.contributions.find((c) => c.confidence === capConf)!;
      const total = f.totals.find((m) => m.primary)!.byConfidence.find((c) => c.confidence === capConf)!;
      const rows = set.byCurrency.map((g) => [g.currency, ...componentCells(g), formatPercent(total.oneDay.var ? g.componentVar1d / total.oneDay.var : 0, 1)]);
      rows.push(["Book total", ...varEsCells(total), "100.0 %"]);
      return table(
        [{ header: "Currency", weight: 1.2 }, ...varEsColumns("Component ", ccy, H), { header: "Share of VaR", numeric: true, weight: 0.9 }],
        rows,
        { caption: `By currency, at ${formatConfidence(capConf)} confidence`, totalRows: [rows.length - 1] },
      );
    },
    "var-history": () => {
      const ci = f.confidences.indexOf(capConf);
      return table(
        [
          { header: "Data to", weight: 1.2 },
          ...f.confidences.map((c) => ({ header: `VaR ${formatConfidence(c)}, 1 day (${ccy})`, numeric: true })),
          { header: `ES ${formatConfidence(capConf)}, 1 day (${ccy})`, numeric: true },
          { header: `VaR ${formatConfidence(capConf)}, ${H} days (${ccy})`, numeric: true },
          { header: `P&L of the next day (${ccy})`, numeric: true },
        ],
        f.varHistory.points.map((p) => [formatDate(p.asOf), ...p.var1d.map(a), a(p.es1d[ci]), a(p.varHorizon[ci]), p.pnlNext === null ? "—" : a(p.pnlNext)]),
      );
    },
  };
}

async function chartBlock(chart: Chart | null, draw: boolean): Promise<FileChild[]> {
  if (!chart || !draw) return [];
  let png: Buffer;
  try {
    png = await renderPng(chart);
  } catch (error) {
    return [new Paragraph({ style: STYLE.note, text: `The chart "${chart.title}" could not be drawn on this server (${error instanceof Error ? error.message : String(error)}); the table gives the same figures.` })];
  }
  const width = BODY_PX;
  const height = Math.round((chart.height / chart.width) * width);
  return [
    new Paragraph({
      keepNext: true,
      spacing: { before: 120, after: 120, line: 240, lineRule: LineRuleType.AUTO },
      children: [new ImageRun({ type: "png", data: png, transformation: { width, height }, altText: { name: chart.title, title: chart.title, description: chart.description } })],
    }),
  ];
}

function headerFor(vm: FilingViewModel): Header {
  const marking = statusMarking(vm);
  return new Header({
    children: [
      new Paragraph({ style: STYLE.marking, children: [new TextRun({ text: marking, color: vm.signOff ? COLOURS.ok : COLOURS.alert })] }),
      new Paragraph({
        style: STYLE.headerText,
        border: { bottom: { style: BorderStyle.SINGLE, size: 4, color: COLOURS.line, space: 4 } },
        text: `${vm.firm.name} · ${vm.period.label} · filing pack, version ${vm.filing.version} · figures as of ${formatDate(vm.figures.asOf)} · ${vm.figures.currency}`,
      }),
    ],
  });
}

function footerFor(vm: FilingViewModel): Footer {
  const pageRun = new TextRun({ children: ["Page ", PageNumber.CURRENT, " of ", PageNumber.TOTAL_PAGES] });
  const line: ParagraphChild[] = [new TextRun({ text: `${vm.firm.name} · reporting period ending ${formatDate(vm.period.end)} · version ${vm.filing.version}` }), new TextRun({ text: "\t" }), pageRun];
  return new Footer({
    children: [
      new Paragraph({ style: STYLE.footerText, border: { top: { style: BorderStyle.SINGLE, size: 4, color: COLOURS.line, space: 4 } }, tabStops: [{ type: TabStopType.RIGHT, position: BODY_TWIPS }], children: line }),
      new Paragraph({ style: STYLE.footerText, children: [new TextRun({ text: `Draft caution: ${vm.caution}` })] }),
    ],
  });
}

/**
 * The Word pack of a filing.
 * @throws when a signed filing's stored hash is not the hash of this content (the pack would misstate what was
 * signed), or a template lacks a value
 */
export async function buildWordPack(vm: FilingViewModel, options: WordPackOptions = {}): Promise<Buffer> {
  if (vm.signOff && vm.signOff.contentHash !== contentHash(vm)) {
    throw new Error("The signature's content hash does not match this filing's content: the pack is not built for content that differs from what was signed.");
  }
  const draw = options.charts ?? true;
  const sections = filingSections(vm);
  const slots = tables(vm);
  const charts: Record<string, Chart | null> = { volatility: volatilityChart(vm), "var-pnl": varPnlChart(vm) };
  const children: FileChild[] = [];
  children.push(new Paragraph({ style: STYLE.caution, children: [new TextRun({ text: "Draft · ", bold: true }), new TextRun({ text: vm.caution })] }));
  for (const section of sections) {
    let first = true;
    for (const [index, b] of section.blocks.entries()) {
      // text that leads into a table or chart (possibly through notes) stays on the figure's page
      const following = section.blocks.slice(index + 1).find((x) => x.kind !== "note");
      const beforeFigure = b.kind !== "h1" && following !== undefined && (following.kind === "table" || following.kind === "chart");
      if (b.kind === "table") {
        const make = slots[b.name];
        if (!make) throw new Error(`templates/filing/${section.id}.md names a table "${b.name}" that the Word pack does not have.`);
        children.push(...make());
      } else if (b.kind === "chart") {
        if (!(b.name in charts)) throw new Error(`templates/filing/${section.id}.md names a chart "${b.name}" that the Word pack does not have.`);
        children.push(...(await chartBlock(charts[b.name], draw)));
      } else if (section.id === "cover" && b.kind === "h1") {
        children.push(new Paragraph({ style: STYLE.coverTitle, text: b.text }));
      } else if (section.id === "cautions" && b.kind === "p" && b.text === vm.caution) {
        children.push(new Paragraph({ style: STYLE.caution, text: b.text }));
      } else if (section.id === "sign-off" && b.kind === "p" && vm.signOff && b.text.includes(vm.signOff.contentHash)) {
        children.push(new Paragraph({ text: b.text }), new Paragraph({ style: STYLE.hash, text: vm.signOff.contentHash }));
      } else {
        children.push(blockParagraph(b as Exclude<Block, { kind: "table" | "chart" }>, section, first, beforeFigure));
      }
      first = false;
    }
  }
  const doc = new Document({
    creator: "Ballast",
    title: `Filing pack, ${vm.firm.name}, ${vm.period.label}, version ${vm.filing.version}`,
    description: vm.caution,
    styles: filingStyles,
    sections: [
      {
        properties: { page: { size: { width: PAGE.width, height: PAGE.height }, margin: { top: 1304, bottom: 1304, left: PAGE.margin, right: PAGE.margin, header: 567, footer: 454 } } },
        headers: { default: headerFor(vm) },
        footers: { default: footerFor(vm) },
        children,
      },
    ],
  });
  return Packer.toBuffer(doc);
}
