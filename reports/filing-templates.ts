/**
 * The filing's template texts (templates/filing/*.md, cached) and the one-line fragments filled in through
 * renderTemplate; a missing value fails loudly, naming the template.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { renderTemplate, type TemplateValues } from "@/lib/templates/render";

const TEMPLATE_DIR = path.join(process.cwd(), "templates", "filing");
const cache = new Map<string, string>();

/** The text of templates/filing/<name>.md (cached). */
export function filingTemplate(name: string): string {
  let text = cache.get(name);
  if (text === undefined) {
    text = readFileSync(path.join(TEMPLATE_DIR, `${name}.md`), "utf8");
    cache.set(name, text);
  }
  return text;
}

export function fill(name: string, text: string, values: TemplateValues): string {
  try {
    return renderTemplate(text, values);
  } catch (error) {
    throw new Error(`templates/filing/${name}.md: ${error instanceof Error ? error.message : String(error)}`);
  }
}

/** A one-line fragment (templates/filing/fragments/<name>.md) filled in. */
export function fragment(name: string, values: TemplateValues = {}): string {
  return fill(`fragments/${name}`, filingTemplate(`fragments/${name}`).trim(), values);
}
