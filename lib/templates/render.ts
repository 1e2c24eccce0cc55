/**
 * One template renderer for e-mail and filing texts: `{{key}}` placeholders replaced by values. A placeholder
 * without a value throws (a message never goes out with a hole in it). `html: true` escapes the values.
 */
import { readFileSync } from "node:fs";
import path from "node:path";

export type TemplateValues = Record<string, string | number>;

const PLACEHOLDER = /\{\{\s*([A-Za-z][A-Za-z0-9_]*)\s*\}\}/g;

export class TemplateError extends Error {}

/** Escape text for HTML element content and attribute values. */
export function escapeHtml(value: string): string {
  return value.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;").replace(/'/g, "&#39;");
}

/** Fill `{{key}}` placeholders from `values`; throws naming every key that has no value. */
export function renderTemplate(text: string, values: TemplateValues, options: { html?: boolean } = {}): string {
  const missing = new Set<string>();
  const result = text.replace(PLACEHOLDER, (_match, key: string) => {
    if (!Object.hasOwn(values, key) || values[key] === undefined || values[key] === null) {
      missing.add(key);
      return "";
    }
    const value = String(values[key]);
    return options.html ? escapeHtml(value) : value;
  });
  if (missing.size) throw new TemplateError(`The template needs a value for: ${[...missing].join(", ")}.`);
  return result;
}

/** Read a template file under templates/ (e.g. "email/reminder.txt"). */
export function readTemplate(name: string): string {
  return readFileSync(path.join(process.cwd(), "templates", name), "utf8");
}
