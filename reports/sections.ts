/**
 * The filing's text sections: each template in templates/filing/ filled from the view model through renderTemplate
 * (a missing value fails loudly, naming the template), split into blocks the packs lay out. Lines are classified
 * before values go in, so text a person typed never becomes a heading or a bullet (see templates/filing/README.md).
 */
import type { TemplateValues } from "@/lib/templates/render";
import { filingTemplate, fill, fragment } from "./filing-templates";
import { formatAmount, formatConfidence, formatDate, formatNumber, formatPValue, formatTimestamp } from "./format";
import { VAR_METHOD_LABELS, type FilingViewModel } from "./view-model";
import { neutralise } from "./neutralise";
import { capitalise, countOf, isAre } from "@/lib/text/count";
import { regulatoryCapitalValues } from "./regulatory-capital-text";

/** Text a person typed, line by line made inert for spreadsheets (see ./neutralise). */
function typed(text: string): string {
  return text.split(/\r?\n/).map(neutralise).join("\n");
}

export { filingTemplate, fragment };

export type Block =
  | { kind: "h1" | "h2" | "p" | "bullet" | "note"; text: string }
  | { kind: "table" | "chart"; name: string };

export interface Section {
  id: SectionId;
  /** the section heading (the template's first line) */
  title: string;
  blocks: Block[];
  /** an appendix section: detail tables after the main sections */
  appendix: boolean;
}

export const MAIN_SECTIONS = ["cover", "regulatory-capital", "capital", "var-es", "stressed", "backtest", "method", "limitations", "data-quality", "changes", "sign-off", "cautions"] as const;
export const APPENDIX_SECTIONS = ["positions", "risk-factors", "correlation", "contributions", "var-history", "method-annex"] as const;
export type SectionId = (typeof MAIN_SECTIONS)[number] | (typeof APPENDIX_SECTIONS)[number];

/** Values that are a person's own typed text, never recased. */
const TYPED_VALUES = new Set(["coverNote", "rationale", "attestation"]);

/** Parse and fill one template into blocks. @throws naming the template and every missing key */
export function renderBlocks(name: string, values: TemplateValues): Block[] {
  const blocks: Block[] = [];
  for (const raw of filingTemplate(name).split(/\r?\n/)) {
    const line = raw.trimEnd();
    if (!line.trim()) continue;
    const slot = /^\[(table|chart) ([a-z0-9-]+)\]$/.exec(line.trim());
    if (slot) {
      blocks.push({ kind: slot[1] as "table" | "chart", name: slot[2] });
      continue;
    }
    let kind: "h1" | "h2" | "p" | "bullet" | "note" = "p";
    let text = line;
    if (line.startsWith("# ")) [kind, text] = ["h1", line.slice(2)];
    else if (line.startsWith("## ")) [kind, text] = ["h2", line.slice(3)];
    else if (line.startsWith("- ")) [kind, text] = ["bullet", line.slice(2)];
    else if (line.startsWith("> ")) [kind, text] = ["note", line.slice(2)];
    const filled = fill(name, text, values);
    if (kind === "h1" || kind === "h2") {
      const heading = filled.replace(/\s*\n\s*/g, " ").trim();
      if (heading) blocks.push({ kind, text: heading });
      continue;
    }
    // a line that starts with a value is a sentence all the same: its first letter is a capital (typed text is kept as typed)
    const lead = /^\{\{(\w+)\}\}/.exec(text)?.[1];
    const sentence = lead !== undefined && !TYPED_VALUES.has(lead);
    for (const part of filled.split(/\r?\n/)) if (part.trim()) blocks.push({ kind, text: sentence ? capitalise(part.trim()) : part.trim() });
  }
  return blocks;
}

function list(items: string[]): string {
  if (items.length <= 1) return items.join("");
  return `${items.slice(0, -1).join(", ")} and ${items[items.length - 1]}`;
}

/** The template values of one section. */
export function sectionValues(id: SectionId, vm: FilingViewModel): TemplateValues {
  const f = vm.figures;
  const ccy = f.currency;
  const capConf = formatConfidence(f.capitalConfidence);
  switch (id) {
    case "cover":
      return {
        firmName: vm.firm.name,
        periodEnd: formatDate(vm.period.end),
        periodLabel: vm.period.label,
        currency: ccy,
        versionNote:
          vm.filing.previousVersion !== null ? `This is version ${vm.filing.version}; it replaces version ${vm.filing.previousVersion}.` : vm.filing.version > 1 ? `This is version ${vm.filing.version}.` : "",
        coverNote: vm.filing.coverNote.trim() ? typed(vm.filing.coverNote) : "No cover note was added.",
      };
    case "regulatory-capital":
      return regulatoryCapitalValues(vm);
    case "capital": {
      const c = f.capital;
      return {
        capital: formatAmount(c.capital),
        currency: ccy,
        confidence: formatConfidence(c.confidence),
        horizonDays: c.horizonDays,
        formula: c.formula,
        varLast: formatAmount(c.varLast),
        multiplier: formatNumber(c.multiplier, 2),
        averagingDays: c.averagingDays,
        varAverage: formatAmount(c.varAverage),
        varTerm: formatAmount(c.varTerm),
        varBinding: c.varBinding === "last" ? "latest VaR" : "average",
        multiplierBase: formatNumber(c.multiplierBase, 2),
        plusFactor: formatNumber(c.plusFactor, 2),
        stressedSentence:
          c.includesStressed && c.stressedVarLast !== null && c.stressedVarAverage !== null && c.stressedMultiplier !== null
            ? fragment("capital-stressed", {
                stressedVarLast: formatAmount(c.stressedVarLast),
                currency: ccy,
                stressedMultiplier: formatNumber(c.stressedMultiplier, 2),
                averagingDays: c.averagingDays,
                stressedVarAverage: formatAmount(c.stressedVarAverage),
                stressedVarTerm: formatAmount(c.stressedVarTerm),
                stressedBinding: c.stressedBinding === "last" ? "latest stressed VaR" : "average",
              })
            : fragment("capital-no-stressed"),
        statement: c.statement,
      };
    }
    case "var-es": {
      const primary = f.totals.find((t) => t.primary);
      const others = f.totals.filter((t) => !t.primary).map((t) => t.label.toLowerCase());
      const cap = f.byAssetClass.find((b) => b.confidence === f.capitalConfidence);
      const total = primary?.byConfidence.find((b) => b.confidence === f.capitalConfidence);
      return {
        asOf: formatDate(f.asOf),
        currency: ccy,
        horizonDays: f.horizonDays,
        primaryMethod: VAR_METHOD_LABELS[f.primaryMethod].toLowerCase(),
        otherMethods: others.length ? fragment("other-methods", { methods: list(others) }) : "",
        scalingStatement: primary ? `Horizon: ${primary.scalingStatement}.` : "",
        diversification: formatAmount(total?.diversificationBenefit1d ?? 0),
        capitalConfidence: capConf,
        assetClasses: cap?.rows.length ?? 0,
      };
    }
    case "stressed": {
      const s = f.stressed;
      return {
        windowStart: formatDate(s.window.start),
        windowEnd: formatDate(s.window.end),
        windowDays: s.window.days,
        chosenBy: s.window.chosenBy === "search" ? `found by searching ${s.windowsSearched ?? "the available"} windows` : "chosen by the firm",
        searchRule: s.searchRule ? `Search rule: ${s.searchRule}.` : "",
        statement: s.statement,
      };
    }
    case "backtest": {
      const b = f.backtest;
      return {
        days: b.days,
        confidence: formatConfidence(b.confidence),
        exceptions: b.exceptions,
        exceptionsSeen: `${countOf(b.exceptions, "exception")} ${b.exceptions === 1 ? "was" : "were"}`,
        expectedExceptions: formatNumber(b.expectedExceptions, 1),
        zone: b.zone,
        plusFactor: formatNumber(b.plusFactor, 2),
        statement: b.statement,
        exceptionRule: `Rule: ${b.exceptionRule}.`,
        kupiecLr: formatNumber(b.kupiec.lr, 3),
        kupiecP: formatPValue(b.kupiec.pValue),
        christoffersenSentence: b.christoffersen
          ? fragment("christoffersen", { lrInd: formatNumber(b.christoffersen.lrInd, 3), pInd: formatPValue(b.christoffersen.pValueInd), lrCc: formatNumber(b.christoffersen.lrCc, 3), pCc: formatPValue(b.christoffersen.pValueCc) })
          : "",
        exceptionIntro: b.exceptionList.length ? fragment("exceptions-some") : fragment("exceptions-none"),
      };
    }
    case "method":
      return {
        methodVersion: vm.method.version,
        approvedNote: vm.method.approvedAt ? `, approved on ${formatDate(vm.method.approvedAt)}` : "",
        sentences: vm.method.sentences.join("\n"),
        rationale: vm.method.rationale.trim() ? typed(vm.method.rationale) : "No rationale was recorded.",
        runId: vm.engine.runId,
        startedBy: vm.engine.startedBy,
        engineVersion: vm.engine.version,
        sampleDays: vm.engine.sample.days,
        sampleFirst: formatDate(vm.engine.sample.firstDate),
        sampleLast: formatDate(vm.engine.sample.lastDate),
        runNotesIntro: vm.engine.notes.length ? fragment("run-notes-intro") : "",
        runNotes: vm.engine.notes.join("\n"),
      };
    case "limitations":
      return {
        limitations: vm.limitations.map((l) => (l.source === "method statement" ? typed(l.text) : l.text)).join("\n"),
        warningsIntro: vm.engine.warnings.length ? fragment("warnings-intro") : "",
        warnings: vm.engine.warnings.map((w) => w.message).join("\n"),
      };
    case "data-quality":
      return {
        errors: vm.dataQuality.counts.error,
        warnings: vm.dataQuality.counts.warning,
        infos: vm.dataQuality.counts.info,
        itemsIntro: vm.dataQuality.items.length ? fragment("data-quality-some") : fragment("data-quality-none"),
      };
    case "changes":
      return {
        versionSentence:
          vm.filing.previousVersion === null
            ? fragment("changes-first")
            : fragment("changes-new-version", { version: vm.filing.version, previousVersion: vm.filing.previousVersion, reason: vm.filing.reason.trim() ? vm.filing.reason.replace(/\s*\n\s*/g, " ") : "not given." }),
        changes: vm.filing.changesSinceLast.map((c) => typed(c).replace(/\n/g, " ")).join("\n"),
      };
    case "sign-off":
      return {
        attestation: fragment("attestation"),
        signedSentence: vm.signOff
          ? fragment("signed", {
              signerName: vm.signOff.signerName,
              licenceLabel: vm.firm.licenceLabel,
              licenceReference: vm.signOff.licenceReference,
              signedAt: formatTimestamp(vm.signOff.signedAt),
              contentHash: vm.signOff.contentHash,
            })
          : fragment("unsigned"),
        supersededIntro: vm.supersededSignatures.length ? fragment("superseded-intro") : "",
        superseded: vm.supersededSignatures
          .map((s) =>
            fragment("superseded-item", { version: s.version, signerName: s.signerName, licenceReference: s.licenceReference, signedAt: formatTimestamp(s.signedAt), contentHash: s.contentHash, supersededAt: formatTimestamp(s.supersededAt), reason: s.reason.replace(/\s*\n\s*/g, " ") }),
          )
          .join("\n"),
      };
    case "cautions":
      return { caution: vm.caution };
    case "positions": {
      const out = f.positions.filter((p) => !p.included);
      return {
        asOf: formatDate(f.asOf),
        currency: ccy,
        capitalConfidence: capConf,
        excludedSentence: out.length
          ? fragment("positions-excluded", { positions: countOf(out.length, "position"), have: out.length === 1 ? "has" : "have", are: isAre(out.length), value: formatAmount(out.reduce((s, p) => s + p.marketValue, 0)), currency: ccy })
          : "",
      };
    }
    case "risk-factors":
      return { statement: f.riskFactorStatement, excludedSentence: f.excludedFactors.length ? fragment("factors-excluded", { factors: f.excludedFactors.map((x) => `${x.factor} (${x.reason})`).join("; ") }) : "" };
    case "correlation":
      return { basis: f.correlation ? `${f.correlation.basis}.` : fragment("correlation-missing") };
    case "contributions": {
      const total = f.totals.find((t) => t.primary)?.byConfidence.find((b) => b.confidence === f.capitalConfidence);
      return { capitalConfidence: capConf, total: formatAmount(total?.oneDay.var ?? 0), currency: ccy };
    }
    case "var-history":
      return { points: f.varHistory.points.length, method: VAR_METHOD_LABELS[f.varHistory.method].toLowerCase(), currency: ccy, statement: f.varHistory.statement };
    case "method-annex": {
      const c = vm.method.candidates ?? null;
      return {
        candidatesIntro: c ? fragment("method-candidates", { days: c.days, confidence: formatConfidence(c.confidence), currency: ccy }) : fragment("method-candidates-none"),
        candidatesStatement: c ? c.statement : "",
      };
    }
  }
}

/** Every section of the filing, main sections first, then the appendices. */
export function filingSections(vm: FilingViewModel): Section[] {
  const make = (id: SectionId, appendix: boolean): Section => {
    const blocks = renderBlocks(id, sectionValues(id, vm));
    const first = blocks[0];
    if (!first || first.kind !== "h1") throw new Error(`templates/filing/${id}.md must start with a "# " heading.`);
    return { id, title: first.text, blocks, appendix };
  };
  return [...MAIN_SECTIONS.map((id) => make(id, false)), ...APPENDIX_SECTIONS.map((id) => make(id, true))];
}

/** The DRAFT marking while unsigned, the signature line once signed. */
export function statusMarking(vm: FilingViewModel): string {
  return vm.signOff ? `SIGNED by ${vm.signOff.signerName} on ${formatDate(vm.signOff.signedAt)} · SHA-256 ${vm.signOff.contentHash.slice(0, 12)}…` : "DRAFT — NOT SIGNED";
}

