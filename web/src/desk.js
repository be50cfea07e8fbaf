// Hedgeleaf page: scenario ladders and the solver, two folding cards.
//
// Both read their settings from the trade's own sections (`ladder`, `solve`;
// core/ladder.hpp, core/solver.hpp), so the exported file gives the CLI the
// same table. They run only while their card is open.
import { cardBasics, cardParts, showControls } from './card.js';
import { Cancelled, started } from './compute.js';
import {
  boundFields,
  button,
  errorLine,
  field,
  fieldRow,
  fillTable,
  make,
  optionList,
  scrollRegion,
  select,
  setText,
} from './dom.js';
import { isPair } from './currency.js';
import { EngineError } from './engine.js';
import { formatNumber, formatPercent, inputText, percentText } from './format.js';
import { contractKey } from './form.js';
import { setPath } from './paths.js';
import { amountCurrency, methodName, priceDigits, priceText } from './render.js';
import { screenNote } from './wording.js';

/**
 * What the folded cards (Scenarios, Solve) share: opening one asks for a recompute (`changed`);
 * request(doc) starts the card's engine call when the card is open and `wanted(doc)`;
 * update(generation, pending, price) shows what it brings unless a newer edit came first.
 */
function foldedCard({
  elements,
  live,
  state,
  command,
  wanted = () => true,
  render,
  draw,
  setStale,
  showError,
  changed,
}) {
  const { card, has } = elements;
  card.addEventListener('toggle', () => card.open && changed(0));
  return {
    ...cardBasics(elements, render),
    request(doc) {
      return has() && card.open && wanted(doc) ? started(live.call(command, doc)) : null;
    },
    async update(generation, pending, price) {
      if (!pending) {
        // folded (or nothing asked): no figures of an older trade may stay, greyed or usable
        if (elements.output.firstChild) elements.output.replaceChildren();
        setStale([command], false);
        return;
      }
      try {
        const r = await pending;
        if (generation !== state.generation) return;
        draw(r, price);
        setStale([command], false);
      } catch (err) {
        if (generation !== state.generation || err instanceof Cancelled) return;
        setStale([command], true);
        if (err instanceof EngineError) showError(err.field, err.message, err.detail);
      }
    },
  };
}

/** A currency pair's base currency (its notional's, as the engine solves quantities), or null. */
function pairBase(doc) {
  return isPair(doc) && typeof doc.underlying.base === 'string' ? doc.underlying.base : null;
}

// What a ladder moves, by kind: [label, path, kind, input properties] of each field.
const spotRange = [
  ['Spot from %', 'ladder.spot_from', 'percent', { placeholder: '−20' }],
  ['to %', 'ladder.spot_to', 'percent', { placeholder: '20' }],
  ['step %', 'ladder.spot_step', 'percent', { placeholder: '2' }],
];
const volRange = [
  ['Vol from (points)', 'ladder.vol_from', 'percent', { placeholder: '−5' }],
  ['to', 'ladder.vol_to', 'percent', { placeholder: '5' }],
  ['step', 'ladder.vol_step', 'percent', { placeholder: '1' }],
];
const timeRange = [
  ['Every … days', 'ladder.time_step_days', 'number', { placeholder: 'a tenth of the life' }],
  ['Up to day', 'ladder.time_to_days', 'number', { placeholder: 'expiry' }],
];

// The fields each kind of move reads (the engine refuses the others: "ladder.spot_from: unknown field").
const rangesOf = { spot: spotRange, volatility: volRange, time: timeRange, grid: [...spotRange, ...volRange] };

/**
 * The client's view of a ladder `r` when the trade has a client price (`price.client_price`): the
 * ladder's P&L is against today's model value, the client's against the price the client pays or
 * receives, so each position P&L moves by the side × quantity × (today's value − client price); the
 * shares held add their change in value from today's spot. Null without a client price.
 */
function clientView(r, price) {
  const cp = price?.client_price;
  if (!cp) return null;
  const sign = r.side === 'sell' ? -1 : 1;
  const shift = sign * r.quantity * (r.today.value - cp.per_unit);
  const shares = cp.holding?.shares ?? 0;
  const pnl = (positionPnl) => positionPnl + shift;
  return { shares, pnl, withShares: (row) => pnl(row.position_pnl) + shares * (row.spot - r.today.spot) };
}

/** The Scenarios card (`ladder` command). */
export function ladderPanel({ live, state, showError, setStale, changed, bindControls }) {
  const elements = cardParts('ladder', state);
  const { controls, output, has } = elements;

  /** The move was changed: drop the range fields the new move does not read, then redraw. */
  function kindChanged() {
    const section = state.doc.ladder;
    if (section && typeof section === 'object' && !Array.isArray(section)) {
      const used = new Set(['kind', 'steps', ...(rangesOf[section.kind ?? 'spot'] ?? []).map(([, p]) => p.slice(7))]);
      for (const key of Object.keys(section)) if (!used.has(key)) delete section[key];
      if (Object.keys(section).length === 0) delete state.doc.ladder;
    }
    render();
  }

  function render() {
    if (!has()) return;
    const kind = state.doc.ladder?.kind ?? 'spot';
    const parts = [
      fieldRow([
        field(
          'Move',
          select('ladder.kind', [
            ['', 'Spot (default)'],
            ['spot', 'Spot'],
            ['volatility', 'Volatility'],
            ['time', 'Time passing'],
            ['grid', 'Spot × volatility'],
          ]),
        ),
      ]),
    ];
    if (kind === 'grid') parts.push(fieldRow(boundFields(spotRange)), fieldRow(boundFields(volRange)));
    else if (rangesOf[kind]) parts.push(fieldRow(boundFields(rangesOf[kind])));
    parts.push(errorLine('ladder'));
    showControls(controls, parts, state.doc, bindControls);
    showVolEnds();
  }

  // The volatility axis's ends last used ([from, to], in decimals): the engine's default axis
  // stops at the volatility's limits (a 4 % volatility goes down 3 points, not 5), so the empty
  // fields' placeholders show the ends it used rather than the usual ±5.
  let volEnds = null;
  function showVolEnds() {
    if (!volEnds) return;
    const paths = ['ladder.vol_from', 'ladder.vol_to'];
    paths.forEach((path, i) => {
      const input = controls.querySelector(`[data-path="${path}"]`);
      if (input) input.placeholder = percentText(volEnds[i]).replace(/^-/, '−');
    });
  }

  function draw(r, price) {
    const shifts =
      r.kind === 'grid' ? r.grid.vol_shifts : r.kind === 'volatility' ? r.rows.map((row) => row.vol_shift) : [];
    if (shifts.length) {
      volEnds = [shifts[0], shifts.at(-1)];
      showVolEnds();
    }
    const ccy = amountCurrency(state.doc) ? ` ${amountCurrency(state.doc)}` : '';
    const client = clientView(r, price);
    const per = (row) => [
      formatNumber(row.value, 4),
      formatNumber(row.pnl, 4),
      `${formatNumber(row.position_pnl, 0)}${ccy}`,
      ...(client ? [formatNumber(client.pnl(row.position_pnl), 0)] : []),
      ...(client?.shares && r.kind === 'spot' ? [formatNumber(client.withShares(row), 0)] : []),
    ];
    const greeks = (row) => [formatNumber(row.delta, 4), formatNumber(row.position_delta, 0)];
    const tail = [
      'Value',
      'P&L per unit',
      'Position P&L',
      ...(client ? [`Client P&L at the client price${ccy}`] : []),
      ...(client?.shares && r.kind === 'spot' ? [`Client P&L with the shares held${ccy}`] : []),
    ];
    let lead = '';
    let head;
    let rows;
    if (r.kind === 'grid') {
      const g = r.grid;
      head = ['Spot \\ vol', ...g.vol_shifts.map((v) => formatPercent(r.today.volatility + v, 1))];
      rows = g.spot_shifts.map((s, i) => [
        `${priceText(state.doc, r.today.spot * (1 + s))} (${s >= 0 ? '+' : '−'}${formatNumber(Math.abs(s) * 100, 0)} %)`,
        ...g.position_pnl[i].map((x) => formatNumber(client ? client.pnl(x) : x, 0)),
      ]);
      lead = client
        ? `The client’s P&L${ccy} at the client price, spot down the side, volatility across.`
        : `Position P&L${ccy} against today, spot down the side, volatility across.`;
    } else if (r.kind === 'time') {
      head = ['Day', 'Date', ...tail, 'Delta', 'Position delta'];
      rows = r.rows.map((row) => [
        inputText(row.days),
        row.date ?? `${formatNumber(row.years, 3)} y`,
        ...per(row),
        ...greeks(row),
      ]);
    } else if (r.kind === 'volatility') {
      head = ['Volatility', ...tail, 'Delta', 'Position delta'];
      rows = r.rows.map((row) => [formatPercent(row.volatility, 1), ...per(row), ...greeks(row)]);
    } else {
      head = ['Spot', 'Move', ...tail, 'Delta', 'Position delta'];
      rows = r.rows.map((row) => [
        priceText(state.doc, row.spot),
        `${row.spot_shift >= 0 ? '+' : '−'}${formatNumber(Math.abs(row.spot_shift) * 100, 1)} %`,
        ...per(row),
        ...greeks(row),
      ]);
    }
    // one layout for every kind (lead line, table, notes), filled in place on each recompute
    let table = output.querySelector('table[data-result="ladder"]');
    if (!table) {
      table = make('table', { className: 'figures', dataset: { result: 'ladder' } });
      output.replaceChildren(
        make('p', { className: 'hint' }),
        scrollRegion('Scenario table', table),
        make('p', { className: 'hint' }),
      );
    }
    const [leadLine, , notesLine] = output.children;
    leadLine.hidden = !lead;
    setText(leadLine, lead);
    fillTable(table, head, rows);
    setText(
      notesLine,
      `${r.notes.map(screenNote).join('; ')}. Lattice: ${methodName(r.lattice.method)}, ${r.lattice.steps} steps.`,
    );
  }

  return {
    ...foldedCard({ elements, live, state, command: 'ladder', render, draw, setStale, showError, changed }),
    kindChanged,
  };
}

/** Where the strike of result leg `leg` lives in the document, or null. */
export function strikePath(doc, leg, oldStrike) {
  const key = contractKey(doc);
  if (key === 'option') return 'option.strike';
  if (key === 'legs') return `legs[${leg}].strike`;
  const index = (doc.structure?.strikes ?? []).indexOf(oldStrike);
  return index >= 0 ? `structure.strikes[${index}]` : null;
}

/** The Solve card (`solve` command). */
export function solvePanel({ live, state, showError, setStale, changed, bindControls, notice, refill }) {
  const elements = cardParts('solve', state);
  const { controls, output, has } = elements;

  function render() {
    if (!has()) return;
    const unknown = state.doc.solve?.for;
    const what = make(
      'select',
      { id: 'solve-for' },
      optionList([
        ['', 'nothing'],
        ['volatility', 'the volatility that gives a premium'],
        ['strike', 'the strike that gives a premium'],
        ['quantity', 'the quantity a budget buys'],
      ]),
    );
    what.value = unknown ?? '';
    what.addEventListener('change', () => {
      if (!what.value) delete state.doc.solve;
      else
        state.doc.solve =
          what.value === 'quantity'
            ? { for: 'quantity', budget: 100000 }
            : what.value === 'strike'
              ? { for: 'strike', leg: contractKey(state.doc) === 'option' ? 0 : 1, target_premium: 0 }
              : { for: 'volatility', target_premium: Number((state.price?.premium ?? 1).toPrecision(3)) };
      render();
      changed(0);
    });
    const parts = [fieldRow([field('Find', what)])];
    if (unknown === 'volatility' || unknown === 'strike') {
      const target = [
        'Target premium per unit',
        'solve.target_premium',
        'number',
        { placeholder: unknown === 'strike' ? '0 = zero cost' : '' },
      ];
      const leg = ['Leg', 'solve.leg', 'index', { placeholder: '1', inputMode: 'numeric' }];
      parts.push(
        fieldRow(boundFields(unknown === 'strike' && contractKey(state.doc) !== 'option' ? [target, leg] : [target])),
      );
    } else if (unknown === 'quantity') {
      parts.push(
        fieldRow(
          boundFields([
            ['Budget', 'solve.budget', 'number', { placeholder: '' }],
            ['Lot size', 'solve.lot_size', 'number', { placeholder: 'none' }],
          ]),
        ),
      );
    }
    parts.push(errorLine('solve'));
    showControls(controls, parts, state.doc, bindControls);
    if (!unknown) output.replaceChildren();
  }

  function apply(r, price) {
    if (elements.card.classList.contains('stale')) return; // a greyed result is for another trade
    const unknown = state.doc.solve?.for;
    let done = '';
    if (unknown === 'volatility') {
      state.doc.market.volatility = Number(r.solution.toPrecision(6));
      done = `volatility ${formatPercent(state.doc.market.volatility, 2)}`;
    } else if (unknown === 'quantity') {
      const amount = r.quantity_in_lots ?? Number(r.solution.toPrecision(8));
      const base = pairBase(state.doc);
      if (base) {
        // a pair's size is its notional, in its base currency here (the engine solves base units)
        state.doc.notional = { ...state.doc.notional, amount, currency: base };
        done = `notional ${inputText(amount)} ${base}`;
      } else {
        state.doc.quantity = amount;
        done = `quantity ${inputText(amount)}`;
      }
    } else if (unknown === 'strike') {
      const path = strikePath(state.doc, r.leg, price?.legs?.[r.leg]?.strike);
      if (!path) return;
      const value = Number(r.solution.toPrecision(6));
      setPath(state.doc, path, value);
      done = `strike ${inputText(value)}`;
    }
    delete state.doc.solve;
    notice(`Applied the solution to the trade: ${done}.`);
    refill();
    changed(0);
  }

  function draw(r, price) {
    const unknown = state.doc.solve?.for;
    const text =
      unknown === 'volatility'
        ? `Volatility ${formatPercent(r.solution, 3)}`
        : unknown === 'quantity'
          ? `${pairBase(state.doc) ? `Notional, ${pairBase(state.doc)},` : 'Quantity'} ${formatNumber(r.solution, 2)}${r.quantity_in_lots !== undefined ? ` (${inputText(r.quantity_in_lots)} in whole lots, ${formatNumber(r.budget_left, 2)} of the budget left)` : ''}`
          : `Strike of leg ${r.leg + 1} ${formatNumber(r.solution, Math.max(4, priceDigits(state.doc)))}`;
    // greyed with the card (messages.js setStale): a stale answer cannot be put into the trade
    const use = button('Use it in the trade', () => apply(r, price), {
      className: 'small',
      dataset: { usesResult: '' },
    });
    const solution = make('p', { className: 'equation' }, [
      make('span', { dataset: { result: 'solve-solution', value: String(r.solution) }, text }),
    ]);
    output.replaceChildren(
      solution,
      use,
      make('p', {
        className: 'hint',
        text: [`${r.iterations ?? 0} iterations, ${r.pricing ?? ''} pricing`, ...r.notes.map(screenNote)].join('; '),
      }),
    );
  }

  return foldedCard({
    elements,
    live,
    state,
    command: 'solve',
    wanted: (doc) => Boolean(doc.solve),
    render,
    draw,
    setStale,
    showError,
    changed,
  });
}
