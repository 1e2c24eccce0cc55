/** The upload service's refusals in plain words (its own read "Invalid config: FileSizeMismatch"). */
export function plainUploadError(message: string): string {
  if (message.includes("FileSizeMismatch")) {
    return "The file is larger than an upload may be: positions files up to 32 MB, price history up to 64 MB. Split it, or remove columns Ballast does not read, and upload again.";
  }
  if (message.includes("FileCountMismatch")) return "Upload one file at a time.";
  if (message.includes("InvalidFileType") || message.startsWith("Invalid config")) return "Upload a CSV (UTF-8 or UTF-16 text) or an XLSX workbook.";
  return message;
}
