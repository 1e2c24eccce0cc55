import { describe, expect, it } from "vitest";
import { capitalise, countOf, isAre, listSome, plural } from "@/lib/text/count";
import { renderBlocks } from "@/reports/sections";

describe("counted words", () => {
  it("uses the singular for exactly one and the plural otherwise", () => {
    expect(countOf(1, "exception")).toBe("1 exception");
    expect(countOf(0, "exception")).toBe("0 exceptions");
    expect(countOf(12, "factor")).toBe("12 factors");
    expect(countOf(2540, "cell format")).toBe("2,540 cell formats");
    expect(countOf(2, "day", "days")).toBe("2 days");
    expect(plural(1, "analysis", "analyses")).toBe("analysis");
    expect(plural(3, "analysis", "analyses")).toBe("analyses");
    expect(`${isAre(1)} ${isAre(2)}`).toBe("is are");
  });

  it("says how many a shortened list shows", () => {
    const twelve = Array.from({ length: 12 }, (_, i) => `F${i + 1}`);
    expect(listSome(twelve, 10)).toBe("F1, F2, F3, F4, F5, F6, F7, F8, F9, F10 (10 of 12 listed)");
    expect(listSome(twelve.slice(0, 10), 10)).toBe("F1, F2, F3, F4, F5, F6, F7, F8, F9, F10");
    expect(listSome([], 10)).toBe("");
  });

  it("capitalises a sentence that starts with a value", () => {
    expect(capitalise("equal weights over 250 days.")).toBe("Equal weights over 250 days.");
    expect(capitalise("")).toBe("");
  });

  it("a filing paragraph that starts with a value starts with a capital", () => {
    const blocks = renderBlocks("correlation", { basis: "equal weights over 250 days, from log returns." });
    const paragraph = blocks.find((b) => b.kind === "p" && "text" in b && b.text.includes("qual weights"));
    expect(paragraph && "text" in paragraph ? paragraph.text : "").toMatch(/^Equal weights over 250 days/);
  });
});
