/** Excel date serials, apart from the workbook reader so that client code reading cells does not pull it in. Pure. */

/** Excel's day count: serial 1 is 1900-01-01, with the 1900 leap-year quirk (serial 60); serial 25569 is 1970-01-01. */
export function excelSerialToIso(serial: number): string | null {
  if (!Number.isFinite(serial) || serial < 1 || serial > 2_958_465) return null;
  const ms = Math.round((serial - 25569) * 86_400_000);
  return new Date(ms).toISOString().slice(0, 10);
}
