import { describe, expect, it } from "vitest";
import { plainUploadError } from "@/lib/uploads/messages";

describe("the upload service's refusals in plain words", () => {
  it("says a file over the size limit is too large, with the limits", () => {
    const message = plainUploadError("Invalid config: FileSizeMismatch");
    expect(message).toContain("larger than an upload may be");
    expect(message).toContain("32 MB");
    expect(message).not.toContain("Invalid config");
  });
  it("names the other refusals plainly and keeps Ballast's own messages", () => {
    expect(plainUploadError("Invalid config: FileCountMismatch")).toBe("Upload one file at a time.");
    expect(plainUploadError("Invalid config: InvalidFileType")).toContain("CSV");
    expect(plainUploadError("This period is filed; its positions can no longer change.")).toBe("This period is filed; its positions can no longer change.");
  });
});
