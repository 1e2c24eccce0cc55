/**
 * Builds both filing packs from the test fixture (a real run on a synthetic book), draft and signed, and converts
 * them to PDF with LibreOffice headless (Debian's libreoffice-writer-nogui and libreoffice-calc-nogui), then to PNG
 * pages with pdftoppm (poppler-utils) where it is installed, for a person to look at:
 *
 *   npx tsx scripts/check-packs-in-libreoffice.ts [out-dir]     (default test-results/packs)
 *
 * Fails when LibreOffice cannot open a pack or produces no PDF. tests/unit/reports/libreoffice.test.ts runs the same
 * check when soffice exists.
 */
import { execFileSync } from "node:child_process";
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { buildWordPack } from "@/reports/docx/filing-pack";
import { buildWorkbookPack } from "@/reports/xlsx/filing-pack";
import { packFileName } from "@/reports/file-names";
import { packFixture } from "@/tests/unit/reports/fixture";

export interface PackCheck {
  pack: string;
  pdf: string;
  pages: number;
  /** PNG pages, when pdftoppm is installed and images were asked for */
  images: string[];
}

/** The first of the given programs on PATH, or null. */
export function findProgram(...names: string[]): string | null {
  for (const dir of (process.env.PATH ?? "").split(path.delimiter)) {
    for (const name of names) {
      const full = path.join(dir, name);
      if (dir && existsSync(full)) return full;
    }
  }
  return null;
}

function pdfPages(pdf: string): number {
  const pdfinfo = findProgram("pdfinfo");
  if (pdfinfo) {
    const info = execFileSync(pdfinfo, [pdf], { encoding: "utf8" });
    const m = /^Pages:\s+(\d+)/m.exec(info);
    if (m) return Number(m[1]);
  }
  return (readFileSync(pdf, "latin1").match(/\/Type\s*\/Page(?!s)/g) ?? []).length;
}

export async function checkPacksInLibreOffice(options: { outDir: string; images?: boolean }): Promise<PackCheck[]> {
  const soffice = findProgram("soffice", "libreoffice");
  if (!soffice) throw new Error("LibreOffice (soffice) is not installed: apt-get install libreoffice-writer-nogui libreoffice-calc-nogui");
  mkdirSync(options.outDir, { recursive: true });
  const { vm, signed } = await packFixture();
  const packs: string[] = [];
  for (const [label, model] of [["draft", vm], ["signed", signed]] as const) {
    for (const kind of ["docx", "xlsx"] as const) {
      const file = path.join(options.outDir, `${label}-${kind === "docx" ? "word" : "workbook"}-${packFileName("fixture", model.period.end, model.filing.version, model.filing.status, kind)}`);
      writeFileSync(file, kind === "docx" ? await buildWordPack(model) : await buildWorkbookPack(model));
      packs.push(file);
    }
  }
  // a profile of its own, so that a LibreOffice already running (or another check) does not take the conversion over
  const profile = mkdtempSync(path.join(os.tmpdir(), "ballast-lo-"));
  try {
    execFileSync(soffice, [`-env:UserInstallation=file://${profile}`, "--headless", "--norestore", "--convert-to", "pdf", "--outdir", options.outDir, ...packs], { stdio: "pipe", timeout: 240_000 });
  } finally {
    rmSync(profile, { recursive: true, force: true });
  }
  const pdftoppm = options.images ? findProgram("pdftoppm") : null;
  return packs.map((pack) => {
    const pdf = pack.replace(/\.(docx|xlsx)$/, ".pdf");
    if (!existsSync(pdf) || statSync(pdf).size === 0) throw new Error(`LibreOffice produced no PDF for ${path.basename(pack)}.`);
    const images: string[] = [];
    if (pdftoppm) {
      const prefix = pdf.replace(/\.pdf$/, "");
      execFileSync(pdftoppm, ["-png", "-r", "60", pdf, prefix], { stdio: "pipe", timeout: 120_000 });
      const pages = pdfPages(pdf);
      const width = String(pages).length;
      for (let i = 1; i <= pages; i++) {
        const found = [`${prefix}-${String(i).padStart(width, "0")}.png`, `${prefix}-${i}.png`].find((candidate) => existsSync(candidate));
        if (found) images.push(found);
      }
    }
    return { pack, pdf, pages: pdfPages(pdf), images };
  });
}

if (process.argv[1]?.endsWith("check-packs-in-libreoffice.ts")) {
  const outDir = path.resolve(process.argv[2] ?? "test-results/packs");
  checkPacksInLibreOffice({ outDir, images: true })
    .then((checks) => {
      for (const c of checks) console.log(`${path.relative(process.cwd(), c.pdf)}: ${c.pages} page(s)${c.images.length ? `, ${c.images.length} PNG page(s)` : ""}`);
    })
    .catch((error) => {
      console.error(error instanceof Error ? error.message : error);
      process.exit(1);
    });
}
