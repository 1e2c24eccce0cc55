/**
 * Demo data generator: `npm run demo:data` (or `npx tsx scripts/generate-demo-data.ts`) writes the invented
 * demo firms' upload files to templates/demo/. Every firm, instrument, name and price is invented.
 *
 * Calendar: business days Monday to Friday from 2023-01-02 to 2026-11-30, skipping 25 December and 1 January.
 *
 * Price model, per instrument i and business day t (log returns, prices P_t = P_{t-1}·exp(r_t)):
 *   z_{i,t} = g·G_t + c·F_{k(i),t} + √(1 − g² − c²)·ε_{i,t}        composite unit-variance innovation
 *   r_{i,t} = μ_{i,t} − κ_i·ln(P_{i,t-1} / P_{i,0}) + s_t·√h_{i,t}·z_{i,t}
 *   h_{i,t+1} = ω_i + α·h_{i,t}·z_{i,t}² + β·h_{i,t},   ω_i = σ_i²·(1 − α − β)   GARCH(1,1), started at σ_i²
 * G (a global market factor), F_k (one factor per asset class: equity, for equities and ETFs; bond; commodity;
 * fx) and ε (idiosyncratic) are independent Student-t draws with ν = 5 scaled to unit variance, from the
 * seeded generator of lib/risk/random.ts. The loadings g and c are chosen per asset class (bonds load
 * negatively on the market factor, so they rally when equities fall). κ is a mild pull back to the starting
 * level for bonds, exchange rates and commodities (zero for equities and ETFs), so they stay in a plausible
 * range over four years.
 * Stress episode 2024-03-01 to 2024-05-31: s_t = 3 (volatility three times), a negative drift for equities,
 * ETFs and commodities, a mild rally for bonds, a drift towards the dollar and the franc; s_t = 1 elsewhere. The GARCH recursion
 * runs on the de-scaled residual √h·z, so the process stays stationary through the episode.
 * Parameters are in CLASS_PARAMS and the instrument tables below; the README written alongside lists them.
 *
 * Planted data-quality problems (Northmoor only, see PLANTED): a stale price run, a gap, a one-day jump, a
 * position without price history, a position in NOK with no NOKEUR series, a corrected close in the price
 * extension, and a positions file whose rows each carry one error.
 *
 * Deterministic: a fixed seed, no clock, no Math.random; running it twice gives byte-identical files.
 */
import { mkdirSync, writeFileSync } from "node:fs";
import path from "node:path";
import { mulberry32, studentTSampler } from "../lib/risk/random";

/**
 * The generator's seed (Northmoor; Pellam uses SEED + 1). Picked among the thirty seeds from 20261130 so that this
 * one sample path shows the designed episode plainly (equities down, bonds up) and the calm years hold few days
 * where a whole asset class jumps at once; the model is the same for every seed.
 */
export const SEED = 20261141;
/** Degrees of freedom of the Student-t innovations. */
export const NU = 5;
export const FIRST_DAY = "2023-01-02";
export const LAST_DAY = "2026-11-30";
/** The last day of the main Northmoor price file; the extension holds the days after it. */
export const MAIN_PRICES_END = "2026-11-20";
export const STRESS = { from: "2024-03-01", to: "2024-05-31", volMultiplier: 3 } as const;
export const OCTOBER_AS_OF = "2026-10-30";
export const NOVEMBER_AS_OF = "2026-11-30";
/** The invented EUR value of one Norwegian krone used for the NOK position's market value (there is no series). */
export const NOK_EUR_RATE = 0.0855;

type Kind = "equity" | "etf" | "government_bond" | "corporate_bond" | "commodity_future" | "fx";
type Factor = "equity" | "bond" | "commodity" | "fx";

interface ClassParams {
  /** loading on the global market factor */
  global: number;
  factor: Factor;
  /** loading on the asset-class factor */
  loading: number;
  alpha: number;
  beta: number;
  /** daily log drift outside the stress episode */
  drift: number;
  /** daily log drift inside the stress episode */
  stressDrift: number;
  /** daily pull back to the starting level */
  reversion: number;
}

export const CLASS_PARAMS: Record<Kind, ClassParams> = {
  equity: { global: 0.55, factor: "equity", loading: 0.35, alpha: 0.06, beta: 0.92, drift: 0.0003, stressDrift: -0.0045, reversion: 0 },
  etf: { global: 0.7, factor: "equity", loading: 0.45, alpha: 0.05, beta: 0.93, drift: 0.00025, stressDrift: -0.0035, reversion: 0 },
  government_bond: { global: -0.25, factor: "bond", loading: 0.85, alpha: 0.04, beta: 0.94, drift: 0, stressDrift: 0.0004, reversion: 0.004 },
  corporate_bond: { global: -0.1, factor: "bond", loading: 0.7, alpha: 0.05, beta: 0.93, drift: 0, stressDrift: -0.0002, reversion: 0.004 },
  commodity_future: { global: 0.35, factor: "commodity", loading: 0.5, alpha: 0.05, beta: 0.93, drift: 0, stressDrift: -0.003, reversion: 0.003 },
  fx: { global: 0.15, factor: "fx", loading: 0.5, alpha: 0.03, beta: 0.95, drift: 0, stressDrift: 0, reversion: 0.004 },
};

interface Spec {
  id: string;
  name: string;
  kind: Kind;
  currency: string;
  /** starting price on FIRST_DAY */
  start: number;
  /** long-run daily volatility */
  vol: number;
  decimals: number;
  /** overrides of the class parameters (exchange rates differ in sign) */
  global?: number;
  stressDrift?: number;
  /** units the quantity is counted in, for the README */
  unit?: string;
  /** the asset class the positions file writes, when it differs from the simulation kind (the swap: "other") */
  fileClass?: string;
}

const eq = (id: string, name: string, currency: string, start: number, vol: number, decimals = 2): Spec => ({ id: `NMB-EQ-${id}`, name, kind: "equity", currency, start, vol, decimals });

/** Northmoor Brokerage Ltd (reporting EUR): every instrument with a price history, in file order. */
export const NORTHMOOR_SERIES: Spec[] = [
  eq("ALDER", "Alder Robotics AG", "EUR", 84.2, 0.017),
  eq("BRACKEN", "Bracken Logistics SE", "EUR", 36.45, 0.015),
  eq("CALDER", "Calder Fine Chemicals NV", "EUR", 52.1, 0.014),
  eq("DRUMLIN", "Drumlin Energie SA", "EUR", 23.38, 0.019),
  eq("ELMSTEAD", "Elmstead Bank AG", "EUR", 14.52, 0.02, 3),
  eq("FARTHING", "Farthing Software SE", "EUR", 128.4, 0.018),
  eq("GORSE", "Gorse Telecom SA", "EUR", 9.84, 0.012, 3),
  eq("HALVARD", "Halvard Bauwerke AG", "EUR", 61.3, 0.016),
  eq("IVERN", "Ivern Pharma NV", "EUR", 97.6, 0.013),
  eq("JESSAMY", "Jessamy Retail Group SA", "EUR", 27.14, 0.017),
  eq("KITTIWAKE", "Kittiwake Aero Components SE", "EUR", 143.2, 0.016),
  eq("LOWMOOR", "Lowmoor Grid Utilities SA", "EUR", 18.62, 0.012),
  eq("MARROW", "Marrow Foods NV", "EUR", 44.08, 0.012),
  eq("ORRERY", "Orrery Semiconductor Inc.", "USD", 212.5, 0.02),
  eq("PINNOCK", "Pinnock Cloud Systems Inc.", "USD", 74.3, 0.019),
  eq("QUARROW", "Quarrow Health Corp.", "USD", 58.16, 0.014),
  eq("ROOKWELL", "Rookwell Insurance plc", "GBP", 6.412, 0.013, 3),
  eq("SALTMARSH", "Saltmarsh Mining plc", "GBP", 21.3, 0.02),
  eq("TESSIN", "Tessin Precision AG", "CHF", 118.4, 0.013),
  eq("URIBACH", "Uribach Nutrition AG", "CHF", 76.2, 0.012),
  eq("VARGFJELL", "Vargfjell Seafood ASA", "NOK", 182.4, 0.016),
  { id: "NMB-ETF-EUROLC", name: "Fernhollow Euro Large Cap Index ETF", kind: "etf", currency: "EUR", start: 48.12, vol: 0.01, decimals: 2 },
  { id: "NMB-ETF-WORLD", name: "Fernhollow World Equity Index ETF", kind: "etf", currency: "EUR", start: 92.4, vol: 0.009, decimals: 2 },
  { id: "NMB-ETF-SMALLCAP", name: "Tidewell Europe Small Cap ETF", kind: "etf", currency: "EUR", start: 37.05, vol: 0.012, decimals: 2 },
  { id: "NMB-ETF-DIVIDEND", name: "Tidewell Europe Dividend ETF", kind: "etf", currency: "EUR", start: 29.36, vol: 0.0095, decimals: 2 },
  { id: "NMB-ETF-TECH", name: "Tidewell Europe Technology Sector ETF", kind: "etf", currency: "EUR", start: 64.8, vol: 0.012, decimals: 2 },
  { id: "NMB-ETF-HEALTH", name: "Tidewell Europe Healthcare Sector ETF", kind: "etf", currency: "EUR", start: 55.2, vol: 0.0095, decimals: 2 },
  { id: "NMB-ETF-USLC", name: "Fernhollow US Large Cap Index ETF", kind: "etf", currency: "USD", start: 410.5, vol: 0.011, decimals: 2 },
  { id: "NMB-ETF-UKMID", name: "Fernhollow UK Mid Cap Index ETF", kind: "etf", currency: "GBP", start: 22.18, vol: 0.011, decimals: 2 },
  { id: "NMB-GB-AUR-2028", name: "Republic of Aurenia 1.50% 2028", kind: "government_bond", currency: "EUR", start: 97.8, vol: 0.002, decimals: 3, unit: "units of 100 nominal" },
  { id: "NMB-GB-AUR-2031", name: "Republic of Aurenia 2.25% 2031", kind: "government_bond", currency: "EUR", start: 101.2, vol: 0.0028, decimals: 3, unit: "units of 100 nominal" },
  { id: "NMB-GB-VAL-2029", name: "Valmark State 3.00% 2029", kind: "government_bond", currency: "EUR", start: 103.4, vol: 0.0024, decimals: 3, unit: "units of 100 nominal" },
  { id: "NMB-GB-VAL-2034", name: "Valmark State 2.75% 2034", kind: "government_bond", currency: "EUR", start: 99.1, vol: 0.0038, decimals: 3, unit: "units of 100 nominal" },
  { id: "NMB-GB-OST-2027", name: "Federation of Ostrelia 0.50% 2027", kind: "government_bond", currency: "EUR", start: 96.0, vol: 0.002, decimals: 3, unit: "units of 100 nominal" },
  { id: "NMB-GB-OST-2033", name: "Federation of Ostrelia 3.25% 2033", kind: "government_bond", currency: "EUR", start: 104.7, vol: 0.0035, decimals: 3, unit: "units of 100 nominal" },
  { id: "NMB-GB-CAR-2030", name: "Kingdom of Carrowmere 4.00% 2030", kind: "government_bond", currency: "GBP", start: 100.9, vol: 0.003, decimals: 3, unit: "units of 100 nominal" },
  { id: "NMB-GB-EST-2032", name: "Commonwealth of Estaran 4.25% 2032", kind: "government_bond", currency: "USD", start: 98.6, vol: 0.0032, decimals: 3, unit: "units of 100 nominal" },
  { id: "NMB-CF-CRUDE", name: "Crude Oil Front-Month Future (rolled)", kind: "commodity_future", currency: "USD", start: 78.4, vol: 0.022, decimals: 2, unit: "barrels" },
  { id: "NMB-CF-NATGAS", name: "Natural Gas Front-Month Future (rolled)", kind: "commodity_future", currency: "USD", start: 3.412, vol: 0.025, decimals: 3, unit: "MMBtu" },
  { id: "NMB-CF-COPPER", name: "Copper Front-Month Future (rolled)", kind: "commodity_future", currency: "USD", start: 3.912, vol: 0.017, decimals: 4, unit: "pounds" },
  { id: "NMB-CF-GOLD", name: "Gold Front-Month Future (rolled)", kind: "commodity_future", currency: "USD", start: 1852.3, vol: 0.015, decimals: 1, unit: "troy ounces" },
  { id: "NMB-CF-WHEAT", name: "Wheat Front-Month Future (rolled)", kind: "commodity_future", currency: "USD", start: 6.815, vol: 0.02, decimals: 3, unit: "bushels" },
  { id: "USDEUR", name: "EUR per US dollar", kind: "fx", currency: "EUR", start: 0.9214, vol: 0.005, decimals: 5, global: -0.15, stressDrift: 0.0005 },
  { id: "GBPEUR", name: "EUR per pound sterling", kind: "fx", currency: "EUR", start: 1.1712, vol: 0.0045, decimals: 5, global: 0.15, stressDrift: -0.0002 },
  { id: "CHFEUR", name: "EUR per Swiss franc", kind: "fx", currency: "EUR", start: 1.0496, vol: 0.004, decimals: 5, global: -0.2, stressDrift: 0.0006 },
];

/**
 * Instruments Northmoor added in November for the standardised building blocks: bills and corporate bonds across the
 * maturity ladder, a bond future and an interest-rate swap. Simulated with their own seed (SEED + 2) so that every
 * earlier series keeps its exact closes; the swap's series is the value of its fixed leg per 100 notional.
 */
export const NORTHMOOR_ADDED_SERIES: Spec[] = [
  { id: "NMB-TB-AUR-2026-12", name: "Republic of Aurenia bill 18 Dec 2026", kind: "government_bond", currency: "EUR", start: 99.62, vol: 0.0002, decimals: 3, unit: "units of 100 nominal" },
  { id: "NMB-TB-AUR-2027-02", name: "Republic of Aurenia bill 26 Feb 2027", kind: "government_bond", currency: "EUR", start: 99.24, vol: 0.0003, decimals: 3, unit: "units of 100 nominal" },
  { id: "NMB-TB-AUR-2027-08", name: "Republic of Aurenia bill 27 Aug 2027", kind: "government_bond", currency: "EUR", start: 98.41, vol: 0.0005, decimals: 3, unit: "units of 100 nominal" },
  { id: "NMB-CB-KITTIWAKE-2027", name: "Kittiwake Aero Components 4.10% 2027", kind: "corporate_bond", currency: "EUR", start: 100.8, vol: 0.0012, decimals: 3, unit: "units of 100 nominal" },
  { id: "NMB-CB-LOWMOOR-2036", name: "Lowmoor Grid Utilities 3.60% 2036", kind: "corporate_bond", currency: "EUR", start: 97.3, vol: 0.004, decimals: 3, unit: "units of 100 nominal" },
  { id: "NMB-CB-JESSAMY-2029", name: "Jessamy Retail Group 6.50% 2029", kind: "corporate_bond", currency: "EUR", start: 102.1, vol: 0.0035, decimals: 3, unit: "units of 100 nominal" },
  { id: "NMB-BF-AUR10-2027-03", name: "Aurenia 10-year bond future, March 2027", kind: "government_bond", currency: "EUR", start: 131.2, vol: 0.0045, decimals: 2, unit: "units of 100 nominal" },
  { id: "NMB-IRS-EUR-2031", name: "Receive-fixed EUR interest-rate swap 2.40% Nov 2031", kind: "government_bond", currency: "EUR", start: 100.4, vol: 0.0035, decimals: 3, unit: "units of 100 notional (fixed-leg value)", fileClass: "other" },
];

/** Pellam Capital Partners (reporting GBP): a smaller firm, no planted problems. */
export const PELLAM_SERIES: Spec[] = [
  { id: "PCP-EQ-ASHCOMBE", name: "Ashcombe Housebuilders plc", kind: "equity", currency: "GBP", start: 4.852, vol: 0.018, decimals: 3 },
  { id: "PCP-EQ-BELLHURST", name: "Bellhurst Water plc", kind: "equity", currency: "GBP", start: 11.24, vol: 0.012, decimals: 2 },
  { id: "PCP-EQ-CORRIE", name: "Corrie Media Group plc", kind: "equity", currency: "GBP", start: 2.364, vol: 0.019, decimals: 3 },
  { id: "PCP-EQ-DARROW", name: "Darrow Wealth plc", kind: "equity", currency: "GBP", start: 7.915, vol: 0.015, decimals: 3 },
  { id: "PCP-EQ-EYEBRIDGE", name: "Eyebridge Engineering plc", kind: "equity", currency: "GBP", start: 15.62, vol: 0.016, decimals: 2 },
  { id: "PCP-EQ-FELLGATE", name: "Fellgate Pharmaceuticals plc", kind: "equity", currency: "GBP", start: 31.05, vol: 0.014, decimals: 2 },
  { id: "PCP-EQ-HOLLISFORD", name: "Hollisford Networks Inc.", kind: "equity", currency: "USD", start: 88.3, vol: 0.019, decimals: 2 },
  { id: "PCP-ETF-UKBROAD", name: "Brookmere UK Broad Market ETF", kind: "etf", currency: "GBP", start: 8.416, vol: 0.01, decimals: 3 },
  { id: "PCP-GB-CAR-2029", name: "Kingdom of Carrowmere 3.50% 2029", kind: "government_bond", currency: "GBP", start: 99.4, vol: 0.0025, decimals: 3, unit: "units of 100 nominal" },
  { id: "PCP-GB-CAR-2035", name: "Kingdom of Carrowmere 4.25% 2035", kind: "government_bond", currency: "GBP", start: 101.8, vol: 0.0038, decimals: 3, unit: "units of 100 nominal" },
  { id: "USDGBP", name: "GBP per US dollar", kind: "fx", currency: "GBP", start: 0.7908, vol: 0.005, decimals: 5, global: -0.15, stressDrift: 0.0005 },
];

/** Position instruments with no price series (invented prices). */
const NO_HISTORY: Record<string, { name: string; kind: Kind; currency: string; price: number }> = {
  "NMB-EQ-WYNCOTE": { name: "Wyncote Battery Systems SE", kind: "equity", currency: "EUR", price: 31.4 },
};

/** The planted data-quality problems, documented in the README and checked by tests/unit/demo-data.test.ts. */
export const PLANTED = {
  stale: { instrument: "NMB-EQ-GORSE", from: "2025-06-10", to: "2025-06-18", days: 7 },
  gap: { instrument: "NMB-EQ-HALVARD", from: "2025-09-01", to: "2025-09-16", days: 12 },
  jump: { instrument: "NMB-EQ-IVERN", date: "2026-03-12", factor: 1.35 },
  noHistory: { instrument: "NMB-EQ-WYNCOTE" },
  missingFx: { instrument: "NMB-EQ-VARGFJELL", currency: "NOK", pair: "NOKEUR" },
  correction: { instrument: "NMB-EQ-BRACKEN", date: "2026-11-20" },
} as const;

// ---------------------------------------------------------------------------------------------- calendar

/** Business days (Monday to Friday, not 25 December or 1 January) from `from` to `to` inclusive. */
export function businessDays(from: string, to: string): string[] {
  const out: string[] = [];
  const end = Date.parse(`${to}T00:00:00Z`);
  for (let t = Date.parse(`${from}T00:00:00Z`); t <= end; t += 86_400_000) {
    const d = new Date(t);
    const day = d.getUTCDay();
    const iso = d.toISOString().slice(0, 10);
    const md = iso.slice(5);
    if (day === 0 || day === 6 || md === "12-25" || md === "01-01") continue;
    out.push(iso);
  }
  return out;
}

// ---------------------------------------------------------------------------------------------- simulation

const FACTORS: Factor[] = ["equity", "bond", "commodity", "fx"];

/** Simulate every series over the days; returns closes rounded to each instrument's decimals. */
function simulate(specs: readonly Spec[], days: readonly string[], seed: number): Map<string, number[]> {
  const draw = studentTSampler(mulberry32(seed), NU);
  const state = specs.map((s) => {
    const p = CLASS_PARAMS[s.kind];
    const g = s.global ?? p.global;
    const variance = s.vol * s.vol;
    return {
      spec: s,
      g,
      c: p.loading,
      idio: Math.sqrt(1 - g * g - p.loading * p.loading),
      omega: variance * (1 - p.alpha - p.beta),
      alpha: p.alpha,
      beta: p.beta,
      drift: p.drift,
      stressDrift: s.stressDrift ?? p.stressDrift,
      reversion: p.reversion,
      h: variance,
      logPrice: Math.log(s.start),
      logStart: Math.log(s.start),
      closes: [] as number[],
    };
  });
  days.forEach((day, t) => {
    const stressed = day >= STRESS.from && day <= STRESS.to;
    const scale = stressed ? STRESS.volMultiplier : 1;
    const global = draw();
    const factor = Object.fromEntries(FACTORS.map((f) => [f, draw()])) as Record<Factor, number>;
    for (const st of state) {
      const eps = draw();
      if (t > 0) {
        const z = st.g * global + st.c * factor[CLASS_PARAMS[st.spec.kind].factor] + st.idio * eps;
        const mu = stressed ? st.stressDrift : st.drift;
        const r = mu - st.reversion * (st.logPrice - st.logStart) + scale * Math.sqrt(st.h) * z;
        st.logPrice += r;
        st.h = st.omega + st.alpha * st.h * z * z + st.beta * st.h;
      }
      st.closes.push(round(Math.exp(st.logPrice), st.spec.decimals));
    }
  });
  return new Map(state.map((st) => [st.spec.id, st.closes]));
}

function round(x: number, decimals: number): number {
  return Number(x.toFixed(decimals));
}

/** A number as plain text with fixed decimals (never exponent notation, never "-0"). */
function fmt(x: number, decimals: number): string {
  const s = x.toFixed(decimals);
  return /^-0(\.0*)?$/.test(s) ? s.slice(1) : s;
}

function csvField(value: string): string {
  return /[",\n\r]/.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

function csv(header: readonly string[], rows: readonly (readonly string[])[]): string {
  return [header, ...rows].map((r) => r.map(csvField).join(",")).join("\n") + "\n";
}

// ---------------------------------------------------------------------------------------------- positions

export const POSITIONS_HEADER = [
  "as_of", "book", "instrument_id", "instrument_name", "asset_class", "currency", "quantity", "price", "market_value", "delta_exposure", "market_value_note",
  // the optional columns the standardised building blocks read
  "instrument_type", "issuer_category", "maturity_date", "coupon", "next_reset_date", "national_market", "commodity", "notional", "underlying_maturity_years",
] as const;

/** Position names where the instrument's series name does not say what is held (currency positions on their rate series). */
const POSITION_NAMES: Record<string, string> = { USDEUR: "US dollar cash balance", GBPEUR: "Sterling overdraft" };

/** The standardised attributes of a Northmoor instrument, as the positions file writes them (invented terms). */
interface Attributes {
  instrument_type?: string;
  issuer_category?: string;
  maturity_date?: string;
  coupon?: string;
  next_reset_date?: string;
  national_market?: string;
  commodity?: string;
  /** "mv": the position's market value (a delta of 1); "nominal": quantity × 100 (units of 100 notional) */
  notional?: "mv" | "nominal";
  underlying_maturity_years?: string;
}

const bond = (issuer: "government" | "qualifying" | "other", maturity: string, coupon: string): Attributes => ({ instrument_type: "bond", issuer_category: issuer, maturity_date: maturity, coupon });
const bill = (maturity: string): Attributes => ({ instrument_type: "bill", issuer_category: "government", maturity_date: maturity, coupon: "0" });
const share = (market: string): Attributes => ({ instrument_type: "equity", national_market: market });
const fund = (market: string): Attributes => ({ instrument_type: "fund", national_market: market });
const commodityFuture = (commodity: string): Attributes => ({ instrument_type: "future", commodity, notional: "mv" });

/** Every Northmoor instrument's standardised attributes (the Pellam files leave the columns empty: it files internal models). */
export const NORTHMOOR_ATTRIBUTES: Record<string, Attributes> = {
  "NMB-EQ-ALDER": share("DE"), "NMB-EQ-BRACKEN": share("DE"), "NMB-EQ-CALDER": share("NL"), "NMB-EQ-DRUMLIN": share("FR"),
  "NMB-EQ-ELMSTEAD": share("DE"), "NMB-EQ-FARTHING": share("DE"), "NMB-EQ-GORSE": share("FR"), "NMB-EQ-HALVARD": share("DE"),
  "NMB-EQ-IVERN": share("NL"), "NMB-EQ-JESSAMY": share("FR"), "NMB-EQ-KITTIWAKE": share("DE"), "NMB-EQ-LOWMOOR": share("FR"),
  "NMB-EQ-MARROW": share("NL"), "NMB-EQ-ORRERY": share("US"), "NMB-EQ-PINNOCK": share("US"), "NMB-EQ-QUARROW": share("US"),
  "NMB-EQ-ROOKWELL": share("GB"), "NMB-EQ-SALTMARSH": share("GB"), "NMB-EQ-TESSIN": share("CH"), "NMB-EQ-URIBACH": share("CH"),
  "NMB-EQ-VARGFJELL": share("NO"), "NMB-EQ-WYNCOTE": share("DE"),
  "NMB-ETF-EUROLC": fund("DE"), "NMB-ETF-WORLD": fund("DE"), "NMB-ETF-SMALLCAP": fund("DE"), "NMB-ETF-DIVIDEND": fund("DE"),
  "NMB-ETF-TECH": fund("DE"), "NMB-ETF-HEALTH": fund("DE"), "NMB-ETF-USLC": fund("US"), "NMB-ETF-UKMID": fund("GB"),
  "NMB-GB-AUR-2028": bond("government", "2028-03-15", "1.5"), "NMB-GB-AUR-2031": bond("government", "2031-06-15", "2.25"),
  "NMB-GB-VAL-2029": bond("government", "2029-09-01", "3"), "NMB-GB-VAL-2034": bond("government", "2034-02-15", "2.75"),
  "NMB-GB-OST-2027": bond("government", "2027-04-15", "0.5"), "NMB-GB-OST-2033": bond("government", "2033-10-15", "3.25"),
  "NMB-GB-CAR-2030": bond("government", "2030-12-07", "4"), "NMB-GB-EST-2032": bond("government", "2032-05-15", "4.25"),
  "NMB-CF-CRUDE": commodityFuture("crude oil"), "NMB-CF-NATGAS": commodityFuture("natural gas"), "NMB-CF-COPPER": commodityFuture("copper"),
  "NMB-CF-GOLD": commodityFuture("gold"), "NMB-CF-WHEAT": commodityFuture("wheat"),
  // added in November for the standardised blocks (their series are in NORTHMOOR_ADDED_SERIES)
  "NMB-TB-AUR-2026-12": bill("2026-12-18"), "NMB-TB-AUR-2027-02": bill("2027-02-26"), "NMB-TB-AUR-2027-08": bill("2027-08-27"),
  "NMB-CB-KITTIWAKE-2027": bond("qualifying", "2027-09-15", "4.1"), "NMB-CB-LOWMOOR-2036": bond("qualifying", "2036-03-14", "3.6"),
  "NMB-CB-JESSAMY-2029": bond("other", "2029-05-15", "6.5"),
  "NMB-BF-AUR10-2027-03": { instrument_type: "future", issuer_category: "government", maturity_date: "2027-03-08", coupon: "6", notional: "mv", underlying_maturity_years: "9.5" },
  "NMB-IRS-EUR-2031": { instrument_type: "swap", maturity_date: "2031-11-28", coupon: "2.4", next_reset_date: "2027-02-26", notional: "nominal" },
  USDEUR: { instrument_type: "currency" },
  GBPEUR: { instrument_type: "currency" },
};

/** Why the NOK position's market value stands without a NOKEUR series (the upload refuses it without a reason). */
export const NOK_VALUE_NOTE = `No NOKEUR series loaded: valued at ${NOK_EUR_RATE} EUR per NOK from the broker statement`;

interface Holding {
  book: string;
  id: string;
  /** target market value in the reporting currency on the October date (negative: short) */
  target: number;
  /** quantity rounded to this lot */
  lot: number;
  /** "nov": opened in November; "oct": closed before the November date */
  only?: "oct" | "nov";
  /** November quantity = October quantity × resize */
  resize?: number;
}

const LOTS: Record<string, number> = { "NMB-CF-CRUDE": 1000, "NMB-CF-NATGAS": 10000, "NMB-CF-COPPER": 25000, "NMB-CF-GOLD": 100, "NMB-CF-WHEAT": 5000 };

/** Northmoor's books: TRADING (equities, some ETFs and bonds), TREASURY (bonds, ETFs), HEDGE (futures, index shorts). */
const NORTHMOOR_HOLDINGS: Holding[] = [
  ...[
    ["ALDER", 1_250_000, 1.5], ["BRACKEN", 820_000], ["CALDER", 640_000], ["DRUMLIN", -450_000], ["ELMSTEAD", 710_000],
    ["FARTHING", 980_000, 0.5], ["GORSE", 380_000], ["HALVARD", 560_000], ["IVERN", 900_000], ["JESSAMY", 420_000],
    ["KITTIWAKE", 1_050_000], ["LOWMOOR", 530_000], ["MARROW", 610_000], ["ORRERY", 1_150_000], ["PINNOCK", 690_000],
    ["QUARROW", 470_000], ["ROOKWELL", 360_000], ["SALTMARSH", 540_000], ["TESSIN", 780_000], ["URIBACH", 450_000],
    ["VARGFJELL", 395_000],
  ].map(([id, target, resize]) => ({ book: "TRADING", id: `NMB-EQ-${id}`, target: target as number, lot: 10, ...(resize ? { resize: resize as number } : {}) })),
  { book: "TRADING", id: "NMB-EQ-WYNCOTE", target: 480_000, lot: 10, only: "nov" },
  { book: "TRADING", id: "NMB-ETF-EUROLC", target: 900_000, lot: 10 },
  { book: "TRADING", id: "NMB-ETF-SMALLCAP", target: 420_000, lot: 10 },
  { book: "TRADING", id: "NMB-ETF-TECH", target: 560_000, lot: 10 },
  { book: "TRADING", id: "NMB-ETF-HEALTH", target: 380_000, lot: 10, only: "oct" },
  { book: "TRADING", id: "NMB-ETF-USLC", target: 750_000, lot: 10 },
  { book: "TRADING", id: "NMB-ETF-UKMID", target: 330_000, lot: 10 },
  { book: "TRADING", id: "NMB-GB-AUR-2031", target: 1_000_000, lot: 100 },
  { book: "TRADING", id: "NMB-GB-VAL-2034", target: 800_000, lot: 100 },
  { book: "TREASURY", id: "NMB-GB-AUR-2028", target: 2_500_000, lot: 100 },
  { book: "TREASURY", id: "NMB-GB-AUR-2031", target: 3_000_000, lot: 100, resize: 1.25 },
  { book: "TREASURY", id: "NMB-GB-VAL-2029", target: 2_200_000, lot: 100 },
  { book: "TREASURY", id: "NMB-GB-VAL-2034", target: 1_800_000, lot: 100 },
  { book: "TREASURY", id: "NMB-GB-OST-2027", target: 1_500_000, lot: 100, only: "oct" },
  { book: "TREASURY", id: "NMB-GB-OST-2033", target: 1_600_000, lot: 100 },
  { book: "TREASURY", id: "NMB-GB-CAR-2030", target: 1_200_000, lot: 100 },
  { book: "TREASURY", id: "NMB-GB-EST-2032", target: 1_400_000, lot: 100 },
  { book: "TREASURY", id: "NMB-ETF-EUROLC", target: 1_100_000, lot: 10 },
  { book: "TREASURY", id: "NMB-ETF-WORLD", target: 1_300_000, lot: 10 },
  { book: "TREASURY", id: "NMB-ETF-DIVIDEND", target: 700_000, lot: 10 },
  { book: "HEDGE", id: "NMB-CF-CRUDE", target: 700_000, lot: LOTS["NMB-CF-CRUDE"] },
  { book: "HEDGE", id: "NMB-CF-NATGAS", target: 300_000, lot: LOTS["NMB-CF-NATGAS"], only: "nov" },
  { book: "HEDGE", id: "NMB-CF-COPPER", target: 500_000, lot: LOTS["NMB-CF-COPPER"] },
  { book: "HEDGE", id: "NMB-CF-GOLD", target: 900_000, lot: LOTS["NMB-CF-GOLD"] },
  { book: "HEDGE", id: "NMB-CF-WHEAT", target: -350_000, lot: LOTS["NMB-CF-WHEAT"] },
  { book: "HEDGE", id: "NMB-ETF-EUROLC", target: -1_200_000, lot: 10 },
  { book: "HEDGE", id: "NMB-ETF-SMALLCAP", target: -400_000, lot: 10 },
  // added in November for the standardised blocks: bills and bonds over the ladder, a bond future, a swap, currency positions
  { book: "TREASURY", id: "NMB-TB-AUR-2026-12", target: 1_500_000, lot: 100, only: "nov" },
  { book: "TREASURY", id: "NMB-TB-AUR-2027-02", target: 2_000_000, lot: 100, only: "nov" },
  { book: "TREASURY", id: "NMB-TB-AUR-2027-08", target: 1_200_000, lot: 100, only: "nov" },
  { book: "TRADING", id: "NMB-CB-KITTIWAKE-2027", target: 800_000, lot: 100, only: "nov" },
  { book: "TRADING", id: "NMB-CB-LOWMOOR-2036", target: 600_000, lot: 100, only: "nov" },
  { book: "TRADING", id: "NMB-CB-JESSAMY-2029", target: 400_000, lot: 100, only: "nov" },
  { book: "HEDGE", id: "NMB-BF-AUR10-2027-03", target: -1_500_000, lot: 10, only: "nov" },
  { book: "TREASURY", id: "NMB-IRS-EUR-2031", target: 4_000_000, lot: 100, only: "nov" },
  { book: "TREASURY", id: "USDEUR", target: 450_000, lot: 1000, only: "nov" },
  { book: "TREASURY", id: "GBPEUR", target: -300_000, lot: 1000, only: "nov" },
];

const PELLAM_HOLDINGS: Holding[] = [
  { book: "PRINCIPAL", id: "PCP-EQ-ASHCOMBE", target: 260_000, lot: 100 },
  { book: "PRINCIPAL", id: "PCP-EQ-BELLHURST", target: 310_000, lot: 10 },
  { book: "PRINCIPAL", id: "PCP-EQ-CORRIE", target: -120_000, lot: 100 },
  { book: "PRINCIPAL", id: "PCP-EQ-DARROW", target: 240_000, lot: 100 },
  { book: "PRINCIPAL", id: "PCP-EQ-EYEBRIDGE", target: 290_000, lot: 10 },
  { book: "PRINCIPAL", id: "PCP-EQ-FELLGATE", target: 350_000, lot: 10 },
  { book: "PRINCIPAL", id: "PCP-EQ-HOLLISFORD", target: 280_000, lot: 10 },
  { book: "PRINCIPAL", id: "PCP-ETF-UKBROAD", target: 400_000, lot: 100 },
  { book: "TREASURY", id: "PCP-GB-CAR-2029", target: 900_000, lot: 100 },
  { book: "TREASURY", id: "PCP-GB-CAR-2035", target: 650_000, lot: 100 },
  { book: "TREASURY", id: "PCP-ETF-UKBROAD", target: 300_000, lot: 100 },
];

interface PositionRow {
  asOf: string;
  book: string;
  id: string;
  name: string;
  assetClass: string;
  currency: string;
  quantity: number;
  price: number;
  decimals: number;
  marketValue: number;
  delta: boolean;
}

function positionCells(p: PositionRow): string[] {
  const mv = fmt(p.marketValue, 2);
  const note = p.currency === "NOK" && p.marketValue !== 0 ? NOK_VALUE_NOTE : "";
  const a = NORTHMOOR_ATTRIBUTES[p.id] ?? {};
  const notional = a.notional === "mv" ? mv : a.notional === "nominal" ? fmt(p.quantity * 100, 2) : "";
  return [
    p.asOf, p.book, p.id, p.name, p.assetClass, p.currency, String(p.quantity), fmt(p.price, p.decimals), mv, p.delta ? mv : "", note,
    a.instrument_type ?? "", a.issuer_category ?? "", a.maturity_date ?? "", a.coupon ?? "", a.next_reset_date ?? "", a.national_market ?? "", a.commodity ?? "", notional, a.underlying_maturity_years ?? "",
  ];
}

interface World {
  specs: Map<string, Spec>;
  days: string[];
  closes: Map<string, number[]>;
  reporting: string;
}

function closeOn(world: World, id: string, day: string): number {
  const i = world.days.indexOf(day);
  const series = world.closes.get(id);
  if (i < 0 || !series) throw new Error(`no close for ${id} on ${day}`);
  return series[i];
}

/** Units of reporting currency per unit of `currency` on `day`. */
function fxRate(world: World, currency: string, day: string): number {
  if (currency === world.reporting) return 1;
  if (currency === "NOK" && world.reporting === "EUR") return NOK_EUR_RATE;
  return closeOn(world, `${currency}${world.reporting}`, day);
}

function instrumentFacts(world: World, id: string): { name: string; kind: Kind; currency: string; decimals: number } {
  const spec = world.specs.get(id);
  if (spec) return spec;
  const nh = NO_HISTORY[id];
  if (!nh) throw new Error(`unknown instrument ${id}`);
  return { ...nh, decimals: 2 };
}

function priceOf(world: World, id: string, day: string): number {
  return NO_HISTORY[id] ? NO_HISTORY[id].price : closeOn(world, id, day);
}

function buildPositions(world: World, holdings: readonly Holding[], month: "oct" | "nov"): PositionRow[] {
  const asOf = month === "oct" ? OCTOBER_AS_OF : NOVEMBER_AS_OF;
  const rows: PositionRow[] = [];
  for (const h of holdings) {
    if (h.only && h.only !== month) continue;
    const facts = instrumentFacts(world, h.id);
    // Quantities are sized on the October prices (November openings on the November prices), then kept.
    const sizingDay = h.only === "nov" ? NOVEMBER_AS_OF : OCTOBER_AS_OF;
    const unitValue = priceOf(world, h.id, sizingDay) * fxRate(world, facts.currency, sizingDay);
    let quantity = Math.round(h.target / unitValue / h.lot) * h.lot;
    if (month === "nov" && h.resize) quantity = Math.round((quantity * h.resize) / h.lot) * h.lot;
    const price = priceOf(world, h.id, asOf);
    const marketValue = round(quantity * price * fxRate(world, facts.currency, asOf), 2);
    rows.push({
      asOf,
      book: h.book,
      id: h.id,
      name: POSITION_NAMES[h.id] ?? facts.name,
      assetClass: (facts as Partial<Spec>).fileClass ?? facts.kind,
      currency: facts.currency,
      quantity,
      price,
      decimals: facts.decimals,
      marketValue,
      delta: facts.kind === "commodity_future" || NORTHMOOR_ATTRIBUTES[h.id]?.notional === "mv",
    });
  }
  return rows;
}

// ---------------------------------------------------------------------------------------------- bad positions

type PositionColumn = (typeof POSITIONS_HEADER)[number];

interface BadRowSpec {
  book: string;
  id: string;
  quantity: number;
  /** the column that carries the planted error, or null for a valid row */
  error: PositionColumn | null;
  note: string;
  /** cells written over the valid row */
  edit?: Partial<Record<PositionColumn, string>>;
  /** write the price (and so the market value) with a minus sign */
  negatePrice?: boolean;
}

/** The bad positions file, row by row: each row is valid but for at most one planted error. */
const BAD_ROW_SPECS: BadRowSpec[] = [
  { book: "TRADING", id: "NMB-EQ-ALDER", quantity: 22000, error: null, note: "valid" },
  { book: "TREASURY", id: "NMB-GB-AUR-2031", quantity: 30000, error: null, note: "valid" },
  { book: "TRADING", id: "NMB-ETF-TECH", quantity: 8000, error: null, note: "valid" },
  { book: "TRADING", id: "NMB-EQ-BRACKEN", quantity: 20000, error: "currency", note: 'unknown currency code "EUX"', edit: { currency: "EUX" } },
  { book: "TRADING", id: "NMB-EQ-CALDER", quantity: 1200, error: "quantity", note: 'non-numeric quantity "12O0" (letter O for zero)', edit: { quantity: "12O0" } },
  { book: "TRADING", id: "NMB-EQ-DRUMLIN", quantity: -19000, error: "as_of", note: "a date that does not exist (2026-02-30)", edit: { as_of: "2026-02-30" } },
  { book: "TRADING", id: "NMB-EQ-ELMSTEAD", quantity: 48000, error: "as_of", note: "a date in the future (2027-01-15)", edit: { as_of: "2027-01-15" } },
  { book: "TRADING", id: "NMB-EQ-ALDER", quantity: 22000, error: "instrument_id", note: "duplicate position: book TRADING and NMB-EQ-ALDER again (as on line 2)" },
  { book: "TRADING", id: "NMB-EQ-FARTHING", quantity: 3800, error: "price", note: "a price of 0", edit: { price: "0.00", market_value: "0.00" } },
  { book: "TRADING", id: "NMB-EQ-GORSE", quantity: 38000, error: "price", note: "a negative price", negatePrice: true },
  { book: "TRADING", id: "NMB-EQ-JESSAMY", quantity: 15000, error: "asset_class", note: 'an unknown asset class "crypto"', edit: { asset_class: "crypto" } },
  { book: "TRADING", id: "NMB-EQ-IVERN", quantity: 9000, error: "instrument_id", note: "an empty instrument id", edit: { instrument_id: "" } },
  {
    book: "TRADING", id: "NMB-EQ-KITTIWAKE", quantity: 7000, error: null,
    note: 'valid, but the instrument name starts with "=HYPERLINK(": stored as text, never evaluated',
    edit: { instrument_name: '=HYPERLINK("https://example.invalid/kittiwake","Kittiwake Aero Components SE")' },
  },
  { book: "TRADING", id: "NMB-EQ-LOWMOOR", quantity: 28000, error: null, note: "valid" },
];

/** The bad positions file's rows by file line (the header is line 1), with the column of the planted error. */
export const BAD_ROWS: { line: number; error: PositionColumn | null; note: string }[] = BAD_ROW_SPECS.map((r, i) => ({ line: i + 2, error: r.error, note: r.note }));

function buildBadPositions(world: World): string[][] {
  return BAD_ROW_SPECS.map((spec) => {
    const facts = instrumentFacts(world, spec.id);
    const sign = spec.negatePrice ? -1 : 1;
    const price = sign * priceOf(world, spec.id, NOVEMBER_AS_OF);
    const cells = positionCells({
      asOf: NOVEMBER_AS_OF, book: spec.book, id: spec.id, name: facts.name, assetClass: facts.kind, currency: facts.currency,
      quantity: spec.quantity, price, decimals: facts.decimals,
      marketValue: round(spec.quantity * price * fxRate(world, facts.currency, NOVEMBER_AS_OF), 2), delta: facts.kind === "commodity_future",
    });
    for (const [column, value] of Object.entries(spec.edit ?? {})) cells[POSITIONS_HEADER.indexOf(column as PositionColumn)] = value;
    return cells;
  });
}

// ---------------------------------------------------------------------------------------------- files

interface Generated {
  files: Record<string, string>;
  facts: Record<string, string | number>;
}

function priceRows(world: World, from: string, to: string, override?: (id: string, day: string, close: number) => number | null): string[][] {
  const rows: string[][] = [];
  world.days.forEach((day, i) => {
    if (day < from || day > to) return;
    for (const spec of world.specs.values()) {
      const close = world.closes.get(spec.id)![i];
      const value = override ? override(spec.id, day, close) : close;
      if (value === null) continue;
      rows.push([day, spec.id, fmt(value, spec.decimals)]);
    }
  });
  return rows;
}

/** A plausible keying error: the last two digits of the close swapped (or, when they are equal, one cent off). */
function mistyped(close: number, decimals: number): number {
  const text = close.toFixed(decimals);
  const a = text[text.length - 2], b = text[text.length - 1];
  if (a !== b && a !== ".") return Number(text.slice(0, -2) + b + a);
  return round(close + 10 ** -decimals, decimals);
}

function build(seed: number): Generated {
  const days = businessDays(FIRST_DAY, LAST_DAY);
  const northmoor: World = {
    specs: new Map([...NORTHMOOR_SERIES, ...NORTHMOOR_ADDED_SERIES].map((s) => [s.id, s])),
    days,
    // the added series draw from their own stream, so every earlier series keeps its exact closes
    closes: new Map([...simulate(NORTHMOOR_SERIES, days, seed), ...simulate(NORTHMOOR_ADDED_SERIES, days, seed + 2)]),
    reporting: "EUR",
  };
  const pellam: World = {
    specs: new Map(PELLAM_SERIES.map((s) => [s.id, s])),
    days,
    closes: simulate(PELLAM_SERIES, days, seed + 1),
    reporting: "GBP",
  };

  // Positions are priced from the true (simulated) closes; the planted problems only touch the price files.
  const novRows = buildPositions(northmoor, NORTHMOOR_HOLDINGS, "nov");
  const octRows = buildPositions(northmoor, NORTHMOOR_HOLDINGS, "oct");
  const pellamRows = buildPositions(pellam, PELLAM_HOLDINGS, "nov");
  const badRows = buildBadPositions(northmoor);

  const { stale, gap, jump, correction } = PLANTED;
  const staleValue = closeOn(northmoor, stale.instrument, stale.from);
  const jumpSpec = northmoor.specs.get(jump.instrument)!;
  const jumpValue = round(closeOn(northmoor, jump.instrument, jump.date) * jump.factor, jumpSpec.decimals);
  const corrSpec = northmoor.specs.get(correction.instrument)!;
  const correctedClose = closeOn(northmoor, correction.instrument, correction.date);
  const provisionalClose = mistyped(correctedClose, corrSpec.decimals);

  const planted = (id: string, day: string, close: number): number | null => {
    if (id === stale.instrument && day >= stale.from && day <= stale.to) return staleValue;
    if (id === gap.instrument && day >= gap.from && day <= gap.to) return null;
    if (id === jump.instrument && day === jump.date) return jumpValue;
    if (id === correction.instrument && day === correction.date) return provisionalClose;
    return close;
  };
  const dayAfterMain = days[days.indexOf(MAIN_PRICES_END) + 1];
  const mainPrices = priceRows(northmoor, FIRST_DAY, MAIN_PRICES_END, planted);
  const extension = [[correction.date, correction.instrument, fmt(correctedClose, corrSpec.decimals)], ...priceRows(northmoor, dayAfterMain, LAST_DAY)];
  const pellamPrices = priceRows(pellam, FIRST_DAY, LAST_DAY);

  const files: Record<string, string> = {
    "northmoor-prices.csv": csv(["date", "instrument", "close"], mainPrices),
    "northmoor-prices-extension.csv": csv(["date", "instrument", "close"], extension),
    "northmoor-positions-2026-11.csv": csv(POSITIONS_HEADER, novRows.map(positionCells)),
    "northmoor-positions-2026-10.csv": csv(POSITIONS_HEADER, octRows.map(positionCells)),
    "northmoor-positions-bad.csv": csv(POSITIONS_HEADER, badRows),
    "pellam-prices.csv": csv(["date", "instrument", "close"], pellamPrices),
    "pellam-positions-2026-11.csv": csv(POSITIONS_HEADER, pellamRows.map(positionCells)),
  };
  const facts = {
    days: days.length,
    mainDays: days.indexOf(MAIN_PRICES_END) + 1,
    mainPriceRows: mainPrices.length,
    extensionRows: extension.length,
    extensionFrom: dayAfterMain,
    pellamPriceRows: pellamPrices.length,
    novRows: novRows.length,
    octRows: octRows.length,
    badRows: badRows.length,
    pellamRows: pellamRows.length,
    staleValue: fmt(staleValue, northmoor.specs.get(stale.instrument)!.decimals),
    jumpBefore: fmt(closeOn(northmoor, jump.instrument, days[days.indexOf(jump.date) - 1]), jumpSpec.decimals),
    jumpTrue: fmt(closeOn(northmoor, jump.instrument, jump.date), jumpSpec.decimals),
    jumpValue: fmt(jumpValue, jumpSpec.decimals),
    jumpAfter: fmt(closeOn(northmoor, jump.instrument, days[days.indexOf(jump.date) + 1]), jumpSpec.decimals),
    provisionalClose: fmt(provisionalClose, corrSpec.decimals),
    correctedClose: fmt(correctedClose, corrSpec.decimals),
    gapBefore: days[days.indexOf(gap.from) - 1],
    gapAfter: days[days.indexOf(gap.to) + 1],
    nokPrice: fmt(closeOn(northmoor, PLANTED.missingFx.instrument, NOVEMBER_AS_OF), 2),
  };
  files["README.md"] = readme(seed, facts, novRows, octRows);
  return { files, facts };
}

// ---------------------------------------------------------------------------------------------- README

function specTable(specs: readonly Spec[]): string {
  const lines = ["| id | name | class | currency | start | daily vol | decimals |", "|---|---|---|---|---|---|---|"];
  for (const s of specs) lines.push(`| ${s.id} | ${s.name} | ${s.kind} | ${s.currency} | ${s.start} | ${(s.vol * 100).toFixed(2)} % | ${s.decimals} |`);
  return lines.join("\n");
}

function readme(seed: number, f: Record<string, string | number>, nov: PositionRow[], oct: PositionRow[]): string {
  const key = (r: PositionRow) => `${r.book} ${r.id}`;
  const octMap = new Map(oct.map((r) => [key(r), r]));
  const novMap = new Map(nov.map((r) => [key(r), r]));
  const changes = [
    ...nov.filter((r) => !octMap.has(key(r))).map((r) => `- added in November: ${r.book} ${r.id} (${r.quantity})`),
    ...oct.filter((r) => !novMap.has(key(r))).map((r) => `- closed in November: ${r.book} ${r.id} (was ${r.quantity})`),
    ...nov.filter((r) => octMap.has(key(r)) && octMap.get(key(r))!.quantity !== r.quantity).map((r) => `- resized: ${r.book} ${r.id} ${octMap.get(key(r))!.quantity} → ${r.quantity}`),
  ];
  const classRows = (Object.keys(CLASS_PARAMS) as Kind[]).map((k) => {
    const p = CLASS_PARAMS[k];
    return `| ${k} | ${p.global} | ${p.factor} ${p.loading} | ${p.alpha} | ${p.beta} | ${(p.drift * 100).toFixed(3)} % | ${(p.stressDrift * 100).toFixed(3)} % | ${p.reversion} |`;
  });
  const bad = BAD_ROWS.map((r) => `| ${r.line} | ${r.error ?? "—"} | ${r.note} |`);
  return `# Demo data (invented)

Upload files for the two invented demo firms. Every firm, instrument, name and price here is invented; the prices
are simulated. Written by \`scripts/generate-demo-data.ts\`; do not edit by hand.

Regenerate with \`npm run demo:data\` (or \`npx tsx scripts/generate-demo-data.ts\`). The generator uses a fixed
seed and no clock, so running it again gives byte-identical files (\`tests/unit/demo-data.test.ts\` checks this).

## Files

All CSV: UTF-8, comma-separated, a header row, ISO dates, LF line ends.

| file | what | rows |
|---|---|---|
| northmoor-prices.csv | Northmoor price history, long layout \`date,instrument,close\`, ${FIRST_DAY} to ${MAIN_PRICES_END} (${f.mainDays} business days), exchange rates as instruments USDEUR, GBPEUR, CHFEUR | ${f.mainPriceRows} |
| northmoor-prices-extension.csv | ${f.extensionFrom} to ${LAST_DAY} for every instrument with history, plus one correction of ${MAIN_PRICES_END} | ${f.extensionRows} |
| northmoor-positions-2026-11.csv | Northmoor positions as of ${NOVEMBER_AS_OF} (this month, open) | ${f.novRows} |
| northmoor-positions-2026-10.csv | Northmoor positions as of ${OCTOBER_AS_OF} (last month) | ${f.octRows} |
| northmoor-positions-bad.csv | a positions file with one planted error per row (see below) | ${f.badRows} |
| pellam-prices.csv | Pellam price history, ${FIRST_DAY} to ${LAST_DAY}, exchange rate USDGBP | ${f.pellamPriceRows} |
| pellam-positions-2026-11.csv | Pellam positions as of ${NOVEMBER_AS_OF} | ${f.pellamRows} |

Row counts exclude the header. Northmoor Brokerage Ltd reports in EUR, Pellam Capital Partners in GBP.

Positions: \`price\` is the instrument's close on the as-of date in its own currency; \`market_value\` is in the
firm's reporting currency, quantity × price × the exchange rate of that date (the rate as written in the price
file). Bond quantities are in units of 100 nominal (prices are per 100); futures quantities are in units of the
underlying (barrels, MMBtu, pounds, troy ounces, bushels) and carry \`delta_exposure\` = market value (a delta of 1).
Short positions have a negative quantity. Northmoor's books are TRADING, TREASURY and HEDGE; Pellam's are
PRINCIPAL and TREASURY.

Between October and November:

${changes.join("\n")}

## Price model

Business days are Monday to Friday, without 25 December and 1 January, from ${FIRST_DAY} to ${LAST_DAY}
(${f.days} days). Per instrument, daily log returns

    z(i,t)   = g·G(t) + c·F(class, t) + √(1 − g² − c²)·ε(i,t)
    r(i,t)   = μ(t) − κ·ln(P(i,t−1) / P(i,0)) + s(t)·√h(i,t)·z(i,t)
    h(i,t+1) = ω + α·h(i,t)·z(i,t)² + β·h(i,t),   ω = σ²·(1 − α − β)

G is a global market factor, F one factor per asset class (equities and ETFs share the equity factor), ε is
idiosyncratic; all are independent Student-t draws with ν = ${NU}, scaled to unit variance, so z has unit variance
and fat tails. GARCH(1,1) starts at the long-run variance σ² (the instrument's daily vol below). κ pulls bonds,
exchange rates and commodities gently back to their starting level.

| class | g (global) | class factor c | α | β | daily drift | drift in stress | κ |
|---|---|---|---|---|---|---|---|
${classRows.join("\n")}

Exchange rates set their own global loading and stress drift (the drift leans towards the dollar and the franc in
the stress; over one sample path the noise can outweigh it): ${[...NORTHMOOR_SERIES, ...PELLAM_SERIES]
    .filter((s) => s.kind === "fx")
    .map((s) => `${s.id} g = ${s.global}, ${((s.stressDrift ?? 0) * 100).toFixed(2)} % a day`)
    .join("; ")}.

**Stress episode** ${STRESS.from} to ${STRESS.to}: s(t) = ${STRESS.volMultiplier} (volatility three times), negative drift
for equities, ETFs and commodities, a mild bond rally; s(t) = 1 elsewhere. The GARCH recursion runs on the
de-scaled residual, so the process stays stationary. A stressed-window search over the history finds it.

Seed: ${seed} for Northmoor, ${seed + 1} for Pellam (mulberry32 with the Student-t sampler of \`lib/risk/random.ts\`),
picked among the thirty seeds from 20261130 so that this one sample path shows the designed episode plainly
(equities down, bonds up) and the calm years hold few days where a whole asset class jumps at once.
Closes are rounded to the decimals below.

### Northmoor instruments

${specTable(NORTHMOOR_SERIES)}

Added in November for the standardised building blocks, simulated with their own seed (${seed + 2}) so the series
above keep their exact closes (the swap's series is its fixed leg's value per 100 notional; its \`asset_class\` is other):

${specTable(NORTHMOOR_ADDED_SERIES)}

The November file's optional columns give each position what the standardised blocks read: \`instrument_type\`,
\`issuer_category\`, \`maturity_date\`, \`coupon\`, \`next_reset_date\` (the swap's floating leg), \`national_market\`
(equities and funds), \`commodity\` and \`notional\` (futures: the market value, a delta of 1; the swap: quantity × 100,
receive fixed), \`underlying_maturity_years\` (the bond future's deliverable). The currency positions are held on their
rate series (USDEUR, GBPEUR: quantity in the foreign currency, price the rate, \`instrument_type\` currency). Maturities
and coupons are invented; Pellam's files leave these columns empty (it files the internal-models figure).

Without price history: NMB-EQ-WYNCOTE, Wyncote Battery Systems SE (EUR, new position in November, invented price ${NO_HISTORY["NMB-EQ-WYNCOTE"].price.toFixed(2)}).

### Pellam instruments

${specTable(PELLAM_SERIES)}

## Planted data-quality problems (Northmoor)

| problem | instrument | dates | detail |
|---|---|---|---|
| stale price run | ${PLANTED.stale.instrument} | ${PLANTED.stale.from} to ${PLANTED.stale.to} | the close stays at ${f.staleValue} for ${PLANTED.stale.days} business days in a row |
| gap | ${PLANTED.gap.instrument} | ${PLANTED.gap.from} to ${PLANTED.gap.to} | ${PLANTED.gap.days} consecutive business days missing (prices on ${f.gapBefore} and ${f.gapAfter}) |
| suspicious jump | ${PLANTED.jump.instrument} | ${PLANTED.jump.date} | close ${f.jumpValue} (+35 % on the true ${f.jumpTrue}; ${f.jumpBefore} the day before, ${f.jumpAfter} the day after) |
| no price history | ${PLANTED.noHistory.instrument} | — | in the November positions, absent from both price files |
| currency without a rate series | ${PLANTED.missingFx.instrument} | — | a NOK position; there is no NOKEUR series (its market value uses an invented ${NOK_EUR_RATE} EUR per NOK; the instrument itself has a price history; the row says so in \`market_value_note\`, without which the upload refuses it) |
| correction in the extension | ${PLANTED.correction.instrument} | ${PLANTED.correction.date} | northmoor-prices.csv has ${f.provisionalClose} (two digits swapped); the extension's first row corrects it to ${f.correctedClose} |

The stress episode also gives real moves that a robust extreme-return check lists for a person to confirm; they are
not planted errors.

## northmoor-positions-bad.csv

Each row carries at most one planted error (line numbers count the header as line 1):

| line | column | error |
|---|---|---|
${bad.join("\n")}
`;
}

/** Write every demo file into `outDir`; returns the file names written. Another seed is for experiments only. */
export function generateDemoData(outDir: string, seed = SEED): string[] {
  const { files } = build(seed);
  mkdirSync(outDir, { recursive: true });
  for (const [name, content] of Object.entries(files)) writeFileSync(path.join(outDir, name), content, "utf8");
  return Object.keys(files);
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(__filename)) {
  const outDir = path.resolve(__dirname, "..", "templates", "demo");
  const written = generateDemoData(outDir);
  console.log(`Wrote ${written.length} files to ${path.relative(process.cwd(), outDir) || outDir}: ${written.join(", ")}`);
}
