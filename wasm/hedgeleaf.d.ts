// Hedgeleaf module: the JavaScript-facing contract of build/wasm/hedgeleaf.js.
//
// One file (the wasm is inlined, -sSINGLE_FILE=1) loaded by the Node tests; the
// page carries the same file with its wasm packed beside it (web/build.mjs) and
// hands the module the compiled wasm through `instantiateWasm`, so the module
// never fetches its own data: URL. It needs no eval (CSP: 'wasm-unsafe-eval' is
// enough) and no file system or network.
//
// Usage (web/src/engine.js wraps this behind one memoised promise):
//   const module = await createHedgeleaf({ onAbort });
//   const envelope = JSON.parse(module.run("price", tradeJsonText));
//   if (envelope.ok) use(envelope.result); else show(envelope.error.field, envelope.error.message);

/** Creates the runtime; resolves once the wasm is compiled and ready. */
export default function createHedgeleaf(options?: {
  /** Called if the runtime aborts (a bug, or memory exhausted); the module is dead afterwards. */
  onAbort?: (what: unknown) => void;
  print?: (text: string) => void;
  printErr?: (text: string) => void;
  /**
   * Instantiate the wasm here instead of from the copy inside the file (Emscripten's
   * hook): call `receive` with the instance made from `imports`, and return {}.
   */
  instantiateWasm?: (
    imports: WebAssembly.Imports,
    receive: (instance: WebAssembly.Instance) => void,
  ) => object;
}): Promise<HedgeleafModule>;

export interface HedgeleafModule {
  /**
   * Run one engine command on a trade document (the JSON text the CLI reads).
   * Never throws for bad input: every C++ exception is caught in
   * core/dispatch/dispatch.cpp's run_command_text and returned as an Envelope text.
   * Documents over 1 MiB (vocabulary().limits.document_bytes) are refused with a
   * message, and so is a request whose estimated work is above the page's budget
   * (core/analytics/work_estimate.hpp: price, solve and hedge, about 3 s of this
   * module; limits.page_work_budget), naming the field that sets its size
   * (commands[].work_field: lattice.steps, hedge.lattice_steps); the native CLI has
   * no such budget.
   */
  run(command: CommandName, tradeJson: string): string;
  /**
   * The same for a trade without a market of its own, priced in a market snapshot
   * (MarketSnapshot as JSON text, schema/market.schema.json): the snapshot becomes the
   * trade's market (fields named market.<field> in messages); a trade that carries its own
   * market is refused, as is a snapshot without as_of. Results carry market_as_of.
   */
  runInMarket(command: CommandName, tradeJson: string, marketJson: string): string;
  /** Engine version, e.g. "0.1.0" (also in every result as engine_version). */
  version(): string;
  /** The commands this build accepts, comma separated, e.g. "hedge,price,tree". */
  commands(): string;
  /** The words and limits the engine accepts, as JSON text of a Vocabulary (never throws). */
  vocabulary(): string;
}

/**
 * What vocabulary() returns (core/commands/vocabulary.hpp; the CLI prints the same with
 * `hedgeleaf --vocabulary`). schema/trade.schema.json and this file are checked against it
 * (tests/vocabulary_check.py).
 */
export interface Vocabulary {
  engine_version: string;
  /** The command table (core/dispatch/command_table.cpp), in name order. */
  commands: { name: CommandName; help: string; work_field: string }[];
  /** Word lists: option_types, leg_types, exercise_styles, structure_exercise_styles, lattice_methods,
   *  sides, margin_types, solve_unknowns, ladder_kinds, path_kinds, stress_shapes, rebalance_units,
   *  sections; structure_shapes with the number of strikes each takes. */
  lists: Record<string, string[]> & { structure_shapes: { name: string; strikes: number }[] };
  /** Limits of no single field, e.g. document_bytes (1048576), document_depth (64), spread (20:
   *  volatility x sqrt(years to the last expiry)), page_work_budget (node updates). */
  limits: Record<string, number>;
  /** Per trade-document field (JSON path, "[]" = every element of a list) its JSON Schema keywords,
   *  e.g. fields["market.volatility"] = { type: "number", exclusiveMinimum: 0, maximum: 5 }. */
  fields: Record<string, {
    type?: "number" | "integer" | "boolean" | "string" | "array";
    minimum?: number; maximum?: number; exclusiveMinimum?: number;
    minItems?: number; maxItems?: number; maxLength?: number;
    enum?: string[]; default?: number | string | boolean;
  }>;
}

/** Commands of the command table (core/dispatch/command_table.cpp); commands() says which this build has. */
export type CommandName = "price" | "hedge" | "tree" | "simulate" | "solve" | "ladder" | "profile" | "compare";

/** What run() returns, as JSON text. */
export type Envelope<R = PriceResult> =
  | { ok: true; result: R }
  | { ok: false; error: EngineError };

/**
 * A refused input. `field` is the JSON path of the offending value in the trade
 * document ("market.volatility", "legs[1].strike", "" for the whole document);
 * `message` always starts with that path: "market.volatility: must be > 0, got -0.2".
 * The CLI prints the same message on stderr and exits 2.
 */
export interface EngineError {
  field: string;
  message: string;
  /**
   * What to do about it, without reading the message: "input" (fix the named field),
   * "budget" (the request is too large for the page: fewer steps or paths, or use the CLI)
   * or "internal" (a defect of the engine; never caused by the input alone).
   */
  kind: 'input' | 'budget' | 'internal';
  /**
   * For a range check: the value given and the bound it broke, in the file's units
   * (decimals for rates and volatility): the value must stand in `relation` to `limit`.
   * The page re-words the message in the units on screen with it.
   */
  detail?: { value: number; limit: number; relation: '<' | '<=' | '>' | '>=' };
}

// ---------------------------------------------------------------------------
// Units everywhere: spot, strike, premium in price units per share; volatility,
// rates and yields as decimals a year (0.25 = 25 %), continuously compounded;
// times in years ACT/365F from valuation_date. Greeks per unit: delta dV/dS,
// gamma d2V/dS2, theta dV/dt per YEAR of calendar time (divide by 365 for a
// day), vega per 1.00 of volatility, rho per 1.00 of rate (divide by 100 for a
// point). Quantities: + = client buys.

/** Trade document (the file the CLI reads); the full format is schema/trade.schema.json. */
export interface TradeDocument {
  valuation_date?: string;               // YYYY-MM-DD; lets other fields be dates; a pair's trade date (required)
  underlying?: Underlying;               // default: an equity
  market: Market | CurrencyMarket;       // CurrencyMarket for a currency pair
  option?: OptionTerms;                  // exactly one of option, legs, structure
  legs?: (OptionTerms & { quantity: number })[] | { type: "stock"; quantity: number }[];
  structure?: {
    shape: "call-spread" | "put-spread" | "collar" | "risk-reversal" | "straddle" | "strangle" | "seagull" | "covered-call";
    strikes: (number | StrikeTerms)[];   // ascending
    expiry_years?: number; expiry_date?: string; expiry_tenor?: string;  // exactly one
    exercise?: "european" | "american";
  };
  strike_tick?: number;                  // > 0: derived and solved strikes round to a multiple of it
  quantity?: number;                     // > 0, default 1 (not for a currency pair: notional)
  notional?: { amount: number; currency: string };  // a currency pair's size, in its base or quote currency
  conventions?: CurrencyConventions;     // a currency pair's quoting conventions
  side?: "buy" | "sell";                 // the client's side, default buy
  lattice?: { method?: "leisen-reimer" | "crr" | "jarrow-rudd" | "tian"; steps?: number; extrapolate?: boolean };
  // Sections read by their own commands (schema/trade.schema.json): quote, hedge, simulate, solve, ladder, profile.
  [section: string]: unknown;
}

/** The market (docs/market.md); with as_of it is also a market snapshot file. */
export interface Market {
  as_of?: string;                        // ISO 8601 date-time, e.g. "2026-12-03T16:30:00Z"; required in a snapshot
  underlying?: string;                   // the share's name, plain text, at most 80 characters
  spot: number;                          // > 0
  volatility: number | VolatilityGrid;   // decimal, > 0, <= 5; or a smile
  rate: number | Curve;                  // decimal, -1..1, continuously compounded
  carry_yield?: number | Curve;          // decimal, -1..1, default 0
  borrow?: number | Curve;               // stock-loan fee, decimal, 0..1, default 0
  dividends?: { date?: string; time_years?: number; amount: number }[];
}

/** What the trade is written on (docs/currency.md). A pair BASE/QUOTE is quoted in QUOTE per one BASE. */
export type Underlying =
  | { kind: "equity" }
  | { kind: "currency_pair";
      base: string; quote: string;       // ISO 4217 codes (three capital letters); base = foreign, quote = domestic
      pip_size?: number;                 // > 0, <= 1; default 0.01 for a JPY quote, else 0.0001
      spot_lag_days?: number;            // 0..5 business days (weekends only), default 2, 1 for USD/CAD
    };

/** A currency pair's market: the two currencies' rates instead of rate, carry_yield, borrow, dividends. */
export interface CurrencyMarket {
  as_of?: string;
  spot: number;                          // quote currency per one base unit, > 0
  volatility: number | VolatilityGrid | SmileByDelta;
  domestic_rate: number | Curve | MoneyMarketRate;  // the quote currency's
  foreign_rate: number | Curve | MoneyMarketRate;   // the base currency's
}

/** A pair's smile as desks quote it, per expiry (docs/currency.md); decimals. Wings: call = atm + bf + rr/2,
 *  put = atm + bf - rr/2, strikes solved from their deltas in conventions.delta; at-the-money is the
 *  delta-neutral straddle. Becomes a grid in percent of the forward. */
export interface SmileByDelta {
  quotes_by_delta: {
    expiry: number | string;             // years, YYYY-MM-DD or a tenor (1m, 1y); strictly increasing
    atm: number;                         // 0.001..5
    rr25: number; bf25: number;          // 25-delta risk reversal (call - put) and butterfly
    rr10?: number; bf10?: number;        // 10-delta, both or neither
  }[];                                   // 1..30 expiries
}

/** A money-market quote, converted exactly to the continuous ACT/365F rate over spot -> delivery. */
export interface MoneyMarketRate {
  rate: number;                          // decimal, -1..1
  day_count?: "ACT/360" | "ACT/365";     // default ACT/360
  compounding?: "simple" | "annual" | "continuous";  // default simple
}

export type PremiumConvention =
  "domestic_per_foreign" | "domestic_pips" | "percent_of_foreign" | "percent_of_domestic" | "foreign_pips";
export type DeltaConvention = "spot" | "forward" | "spot_premium_adjusted" | "forward_premium_adjusted";

export interface CurrencyConventions {
  premium?: PremiumConvention;           // default domestic_per_foreign
  premium_currency?: string;             // the base or the quote currency, default the quote
  premium_date?: string;                 // YYYY-MM-DD, default the spot date; trade date .. delivery date
  delta?: DeltaConvention;               // default spot_premium_adjusted when paid in the base currency, else spot
}

/** The `currency` section of a currency pair's price result (docs/currency.md). */
export interface CurrencySection {
  pair: string; base: string; quote: string; pip_size: number; spot_lag_days: number;
  dates: { trade: string; spot: string; expiry: string; delivery: string; premium: string };
  years: { volatility: number; discounting: number; forward: number };  // ACT/365F
  rates: { domestic: CurrencyRate; foreign: CurrencyRate; note: string };
  forward: number;                       // outright forward for the delivery date
  forward_points: number;                // (forward - spot) / pip_size
  discount_factor: number;               // domestic, delivery back to the premium date
  lattice: { rate: number; carry: number; years: number; note: string };
  notional: { amount: number; currency: string; [currency: string]: number | string | null };
  premium: { convention: PremiumConvention; value: number | null; currency: string; amount: number;
             in_each_convention: Record<PremiumConvention, number | null>; note: string };
  delta: { convention: DeltaConvention; value: number; in_each_convention: Record<DeltaConvention, number>;
           [position: string]: unknown };  // position_<BASE>: the position's delta in base currency
  /** Only with a smile quoted by delta: per expiry, the points its quotes gave. */
  smile_by_delta?: { expiry_years: number; forward: number;
                     points: Record<"atm" | "put_25" | "call_25" | "put_10" | "call_10",
                                    { strike: number; volatility: number; percent_of_forward: number }> }[];
}
export interface CurrencyRate {
  zero_rate: number;                     // continuous ACT/365F, spot -> delivery
  discount_factor: number;
  quoted: MoneyMarketRate | null;
}

/** A market snapshot file: a market that says when it was taken. */
export type MarketSnapshot = Market & { as_of: string };

/** Implied volatilities by expiry (rows) and strike (columns), decimals; or the same as table text. */
export interface VolatilityGrid {
  strike_basis?: "percent_of_spot" | "percent_of_forward" | "absolute";  // default percent_of_spot
  expiries?: (number | string)[];        // increasing: years, "YYYY-MM-DD" or tenors "3m", "1y"; at most 30
  strikes?: number[];                    // increasing, in strike_basis; at most 41
  vols?: number[][];                     // vols[i][j]: expiry i, strike j
  table?: string;                        // instead of the three lists: tab, semicolon or comma separated text
}

/** Continuously compounded zero rates (ACT/365F) at points in time, nearest first; or table text. */
export interface Curve {
  points?: { tenor?: string; date?: string; years?: number; rate: number }[];  // one time each; at most 100
  table?: string;
}

/** A strike the way desks say it: exactly one key. */
export type StrikeTerms = { percent_of_spot: number } | { percent_of_forward: number } | { delta: number };

export interface OptionTerms {
  type: "call" | "put" | "digital-call" | "digital-put";
  strike: number | StrikeTerms;                  // a price, or as a percentage or a delta
  expiry_years?: number; expiry_date?: string;   // exactly one of the three
  expiry_tenor?: string;                          // "1w", "3m", "6m", "1y", "18m" (docs/trade-file.md)
  exercise?: "european" | "american" | "bermudan";
  exercise_dates?: string[]; exercise_years?: number[];  // bermudan only
  payout?: number;                                // digitals only, default 1
}

export interface Greeks { delta: number; gamma: number; theta: number; vega: number; rho: number }

/** Result of "price". */
export interface PriceResult {
  premium: number;                       // per unit, net of legs, lattice value
  greeks: Greeks;                        // per unit
  closed_form: { premium: number; greeks: Greeks };  // European closed-form reference
  early_exercise_premium: number | null; // premium - closed_form.premium; null when all legs are European
  lattice: { method: string; steps: number; coarse_steps: number; extrapolated: boolean; error_estimate: number };
  replication: { spot: number; shares: number; cash: number; value: number };  // per unit: shares*spot + cash = value
  // (A currency pair's results name "foreign" wherever an equity's name "shares": replication.foreign, ...)
  currency?: CurrencySection;            // a currency pair only
  position: { quantity: number; side: "buy" | "sell"; premium: number; greeks: Greeks };  // signed by side
  legs: { type: string; quantity: number; premium: number; greeks: Greeks; closed_form_premium: number;
          error_estimate: number; strike?: number; expiry_years?: number; exercise?: string;
          /** With a smile, curves, borrow, derived strikes, strike_tick or as_of: */
          strike_percent_of_spot?: number;
          market?: { volatility: number; volatility_extrapolated: boolean; rate: number; carry_yield: number;
                     borrow: number };     // the leg's volatility and the curves' averages to its expiry
          strike_written?: { form: "percent_of_spot" | "percent_of_forward" | "delta"; value: number;
                             before_rounding: number } }[];
  /** With a smile, curves, borrow, derived strikes, strike_tick or as_of. */
  market?: { as_of: string | null; underlying: string | null; smile: boolean; rates: string };
  strike_tick?: number;
  /** Every command's result, when the market has an as_of. */
  market_as_of?: string;
  spot: number;
  expiry_years: number;
  notes: string[];                       // from the lattices: not extrapolated and why, fallbacks, rough Greeks
  engine_version: string;
  /** Present when the trade has a `quote` section (currency required). */
  client_price?: {
    currency: string;                    // ISO 4217, three capital letters
    margin_type: "absolute" | "fraction_of_premium" | "volatility";
    margin: number;                      // price units, fraction of premium, or volatility (decimal)
    tick: number | null;
    mid: PriceLevel; bid: PriceLevel; offer: PriceLevel;
    client_side: string;                 // "buys at the offer" | "sells at the bid"
    per_unit: number; total: number; fraction_of_notional: number; notional: number;
    desk_margin_total: number;
    client: string | null; notes: string | null;  // plain text: show with textContent only
    caution: string;
  };
}

export interface PriceLevel { per_unit: number; total: number; fraction_of_notional: number }

// ---------------------------------------------------------------------------
// The other commands, as far as the page reads them (full fields: the writers in
// core/commands/*.cpp). Per unit of the trade held long unless a field says position/desk.

/** "profile": P&L against spot at the first expiry and valued today. */
export interface ProfileResult {
  rows: { spot: number; payoff: number; pnl_at_expiry: number; pnl_today: number; value_today: number }[];
  break_even: number[];                  // spots where pnl_at_expiry = 0, ascending
  break_even_ranges: [number, number][]; // spans where it is 0 throughout
  horizon_years: number; horizon_date?: string;
  premium: number;
}

/** "hedge": the schedule along one path (the trade's `hedge` section). */
export interface HedgeResult {
  rows: { date: string | null; years: number; event: string; spot: number; option_value: number;
          delta: number | null; shares_held: number; shares_traded: number; cash: number;
          portfolio_value: number; tracking_error: number }[];
  totals: { premium: number; payoff: number; portfolio_value: number; replication_error: number;
            total_shares_traded: number; total_costs: number; end_event: string };
  desk: { shares_at_start: number; shares_at_end: number; pnl: number };
  notes: string[];
  price_premium: number;                 // the price command's premium for the same trade
  difference_from_price: number;         // totals.premium - price_premium (a note says so when visible)
}

/** "tree": the lattice nodes for the tree view and, for a lattice path, the path. */
export interface TreeResult {
  nodes: { step: number; index: number; spot: number; value: number; shares: number; cash: number;
           event: "none" | "early" | "expiry" }[];
  up: number; down: number; p_up: number; dt_years: number; to_step: number;
  price_premium: number;                 // the price command's premium for the same trade
  difference_from_price: number;         // the root's value - price_premium (a note says so when visible)
}

/** "simulate": discrete-hedging P&L over many paths (the trade's `simulate` section). */
export interface SimulateResult {
  paths: number; premium: number; volatility: number; pricing_volatility: number;
  rows: { frequency: string; rebalancings: number; mean: number; sd: number; sd_standard_error: number;
          p05: number; p50: number; p95: number; mean_costs: number; desk_sd: number }[];
  histogram: { edges: number[]; series: { frequency: string; counts: number[] }[] };
  monte_carlo_error: string;
}
