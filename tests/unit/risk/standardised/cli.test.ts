import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { spawnSync } from "node:child_process";
import { tmpdir } from "node:os";
import path from "node:path";
import { commands } from "@/lib/engine-cli/standardised";
import { CliError } from "@/lib/engine-cli/io";

let dir = "";
const file = (name: string, text: string): string => {
  const p = path.join(dir, name);
  writeFileSync(p, text);
  return p;
};

/** Run the command in-process and return what it printed. */
function run(argv: string[]): string {
  let out = "";
  const spy = vi.spyOn(process.stdout, "write").mockImplementation((chunk: string | Uint8Array) => {
    out += String(chunk);
    return true;
  });
  try {
    commands.standardised(argv);
  } finally {
    spy.mockRestore();
  }
  return out;
}

const HEADER = "instrument,asset_class,instrument_type,market_value,currency,issuer_category,maturity_date,coupon,national_market,notional,underlying_maturity_years,next_reset_years,residual_maturity_years,modified_duration";
let book = "";
beforeAll(() => {
  dir = mkdtempSync(path.join(tmpdir(), "ballast-std-"));
  book = file(
    "book.csv",
    [
      HEADER,
      "GB,government_bond,bond,1000,EUR,government,2031-05-31,2.25,,,,,,4.2",
      "EQ,equity,,300,EUR,,,,DE,,,,,",
      "US,equity,equity,-100,USD,,,,US,,,,,",
      "FUT,government_bond,future,0,EUR,government,,6,,2000,8.5,,0.25,6.4",
      "SW,other,swap,0,USD,,,3.1,,-1000,,0.5,5,4.5",
    ].join("\n") + "\n",
  );
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("engine standardised", () => {
  it("prints the issue's fields", () => {
    const out = JSON.parse(run(["--positions", book, "--as-of", "2026-11-30", "--reporting-currency", "EUR", "--json"]));
    for (const k of ["total", "blocks", "interestRate", "equity", "fx", "commodities", "rwa", "caution"]) expect(out).toHaveProperty(k);
    expect(Object.keys(out.blocks)).toEqual(["interestRateSpecific", "interestRateGeneral", "equitySpecific", "equityGeneral", "fx", "commodities", "options"]);
    const eur = out.interestRate.byCurrency[0];
    for (const k of ["currency", "method", "bands", "vertical", "zones", "between", "residual", "charge"]) expect(eur).toHaveProperty(k);
    for (const k of ["band", "zone", "weightedLong", "weightedShort", "matched"]) expect(eur.bands[0]).toHaveProperty(k);
    for (const k of ["zone", "matched", "net"]) expect(eur.zones[0]).toHaveProperty(k);
    expect(Object.keys(eur.between)).toEqual(["zone12", "zone23", "zone13"]);
    for (const k of ["market", "gross", "net", "specific", "general"]) expect(out.equity.byMarket[0]).toHaveProperty(k);
    for (const k of ["netLong", "netShort", "gold", "overallNetOpenPosition", "charge"]) expect(out.fx).toHaveProperty(k);
    expect(out.interestRate.byCurrency.map((c: { currency: string }) => c.currency)).toEqual(["EUR", "USD"]);
    expect(out.equity.byMarket.map((m: { market: string }) => m.market)).toEqual(["DE", "US"]);
    // EQ had no instrument_type: its asset class made it an equity
    expect(out.equity.byMarket[0].gross).toBe(300);
    expect(out.total).toBeCloseTo(Object.values(out.blocks as Record<string, number>).reduce((s, v) => s + v, 0), 9);
    expect(out.rwa).toBeCloseTo(12.5 * out.total, 9);
  });
  it("--method duration and a --profile file", () => {
    const prof = file("profile.json", JSON.stringify({ standardised: { equity: { liquidAndDiversified: true } } }));
    const out = JSON.parse(run(["--positions", book, "--as-of", "2026-11-30", "--reporting-currency", "EUR", "--method", "duration", "--profile", prof, "--json"]));
    expect(out.method).toBe("duration");
    expect(out.interestRate.byCurrency[0].method).toBe("duration");
    expect(out.equity.byMarket[0].specificRate).toBe(0.04);
  });
  it("bad input: one line naming the row and the column", () => {
    const noMaturity = file("bad.csv", `${HEADER}\nEQ,equity,equity,300,EUR,,,,DE,,,,,\nGB,government_bond,bond,1000,EUR,government,,2.25,,,,,,\n`);
    expect(() => run(["--positions", noMaturity, "--reporting-currency", "EUR", "--json"])).toThrow(
      new CliError('--positions: row 3, column "residual_maturity_years": a bond needs a residual maturity (residual_maturity_years or maturity_date)'),
    );
    const notNumber = file("bad2.csv", `${HEADER}\nGB,government_bond,bond,1000,EUR,government,,2.x,,,,,3,\n`);
    expect(() => run(["--positions", notNumber, "--json"])).toThrow(/^row 2, column "coupon": "2.x" is not a number$/);
    expect(() => run(["--positions", book, "--json"])).toThrow(/several currencies \(EUR, USD\): give --reporting-currency/);
    const badProfile = file("bad-profile.json", JSON.stringify({ fx: { rat: 0.1 } }));
    expect(() => run(["--positions", book, "--reporting-currency", "EUR", "--profile", badProfile, "--json"])).toThrow(/unknown setting profile.fx.rat/);
    expect(() => run(["--positions", book, "--reporting-currency", "EUR", "--method", "ladder"])).toThrow(/--method must be one of maturity\|duration/);
  });
  it("the README's example book: every block charged, figures that can be followed by hand", () => {
    const fixture = path.join(__dirname, "fixtures", "book.csv");
    const out = JSON.parse(run(["--positions", fixture, "--as-of", "2026-11-30", "--reporting-currency", "EUR", "--json"]));
    expect(Object.values(out.blocks as Record<string, number>).every((v) => v > 0)).toBe(true);
    // specific: qualifying 850,000 at exactly 24 months × 1 % + other 400,000 × 8 %
    expect(out.blocks.interestRateSpecific).toBeCloseTo(850_000 * 0.01 + 400_000 * 0.08, 6);
    // FX: GBP 620,000; USD 400,000 − 12,500 + 310,000 − 250,000 (gold priced in USD apart) = 447,500; + gold 90,000; × 8 %
    expect(out.fx.netLong).toBeCloseTo(620_000 + 447_500, 6);
    expect(out.fx.charge).toBeCloseTo(0.08 * (1_067_500 + 90_000), 6);
    // the put on 4,000 Alder shares at 161.99 carves 647,960 out of the long 2,016,775.50
    expect(out.options[0].underlyingValue).toBeCloseTo(647_960, 6);
    expect(out.equity.byMarket.find((m: { market: string }) => m.market === "DE").gross).toBeCloseTo(2_016_775.5 - 647_960, 6);
    expect(out.caution).toMatch(/^Draft computed under the stated method/);
  });
  it("through npm run engine: exit 1 and exactly one line on stderr", () => {
    const bad = file("bad3.csv", `${HEADER}\nGB,government_bond,bond,1000,EUR,,,2.25,,,,,3,\n`);
    const r = spawnSync("npx", ["tsx", "lib/engine-cli.ts", "standardised", "--positions", bad, "--json"], { encoding: "utf8" });
    expect(r.status).toBe(1);
    expect(r.stdout).toBe("");
    expect(r.stderr.trimEnd().split("\n")).toEqual(['engine: --positions: row 2, column "issuer_category": a bond needs its issuer category (government, qualifying or other)']);
  });
});
