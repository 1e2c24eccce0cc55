/**
 * The filing pack's names for xlsx-populate's types (declared once, in lib/xlsx-populate.d.ts). Workbooks from
 * `XlsxPopulate.fromFileAsync` / `fromBlankAsync` / `fromDataAsync` give a `PackWorkbook` through `asPackWorkbook`.
 */
export type {
  StyleValues,
  Cell as PackCell,
  Column as PackColumn,
  Row as PackRow,
  PaneOptions,
  Range as PackRange,
  Sheet as PackSheet,
  Workbook as PackWorkbook,
} from "xlsx-populate";
import type { Workbook as PackWorkbook } from "xlsx-populate";

/** Whether a value is a workbook with the API above (xlsx-populate publishes no types; its objects are checked here). */
function isPackWorkbook(value: unknown): value is PackWorkbook {
  if (typeof value !== "object" || value === null) return false;
  const methods = ["sheets", "sheet", "addSheet", "definedName", "outputAsync"] as const;
  return methods.every((name) => typeof Reflect.get(value, name) === "function");
}

/** A workbook xlsx-populate opened, as a PackWorkbook. @throws when it is not one */
export function asPackWorkbook(value: unknown): PackWorkbook {
  if (!isPackWorkbook(value)) throw new TypeError("xlsx-populate returned something that is not a workbook");
  return value;
}
