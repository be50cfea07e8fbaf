// Hedgeleaf page: the hedge schedule along a path the client picks.
//
// The path lives in the trade's `hedge` section (core/hedge.hpp), so the file
// the page exports gives the CLI the same schedule. Four kinds of path: steps
// clicked on a small tree (kind "lattice", moves "UDDU..."), spots typed per
// date ("spots"), a random path ("scenario", the engine's default) and a
// stress shape ("stress"). The tree view (tree.js) comes from the `tree` command.
import { cardBasics, cardParts, showControls } from './card.js';
import { drawChart } from './chart.js';
import { Cancelled, started } from './compute.js';
import { isPair, pairCodes } from './currency.js';
import {
  bound,
  boundFields,
  button,
  byId,
  errorLine,
  field,
  fieldRow,
  fillTable,
  make,
  select,
  whenInput,
} from './dom.js';
import { EngineError } from './engine.js';
import { formatNumber, formatSmart } from './format.js';
import { priceDigits } from './render.js';
import { drawTree } from './tree.js';
import { screenNote } from './wording.js';

const kinds = [
  ['lattice', 'Steps on a tree'],
  ['spots', 'Spots per date'],
  ['scenario', 'Random path'],
  ['stress', 'Stress'],
];
const maxTreeSteps = 12; // what fits on screen; the CLI takes longer paths

/** The kind of path the trade asks for (the engine's default is a random path). */
export function pathKind(doc) {
  const kind = doc.hedge?.path?.kind;
  return kinds.some(([k]) => k === kind) ? kind : 'scenario';
}

/** The hedge card: path controls, tree, chart and schedule table. */
export function hedgePanel({ live, state, showError, setStale, changed, bindControls }) {
  const elements = cardParts('hedge', state);
  const { card, controls, has } = elements;
  const treeHost = byId('hedge-tree');
  const table = card.querySelector('[data-result="hedge-schedule"]');
  const hasTree = () => state.commands.includes('tree');
  let lastRows = [];
  let lastTree = null;

  function hedgeSection() {
    if (!state.doc.hedge || typeof state.doc.hedge !== 'object' || Array.isArray(state.doc.hedge)) state.doc.hedge = {};
    return state.doc.hedge;
  }

  function movesOf(doc) {
    const moves = doc.hedge?.path?.moves;
    return typeof moves === 'string' ? moves.toUpperCase() : 'UDUDUD';
  }

  function setMoves(moves) {
    hedgeSection().path = { kind: 'lattice', moves };
    render();
    changed(0);
  }

  function setKind(kind) {
    const hedge = hedgeSection();
    if (kind === 'lattice') hedge.path = { kind, moves: movesOf(state.doc).slice(0, maxTreeSteps) || 'UDUDUD' };
    else if (kind === 'spots') {
      // start from the spots of the last schedule shown, so there is one per date
      const spots = lastRows.slice(1).map((row) => Number(row.spot.toPrecision(6)));
      hedge.path = { kind, spots: spots.length ? spots : [state.doc.market?.spot ?? 100] };
    } else if (kind === 'stress') hedge.path = { kind, shape: 'fall', change: 0.2 };
    else hedge.path = { kind: 'scenario' };
    if (kind === 'lattice') delete hedge.rebalance;
    render();
    changed(0);
  }

  function fitSpots() {
    const hedge = hedgeSection();
    const typed = Array.isArray(hedge.path?.spots) ? hedge.path.spots : [];
    const saved = hedge.path;
    hedge.path = { kind: 'scenario' };
    const doc = structuredClone(state.doc);
    hedge.path = saved;
    live.call('hedge', doc).then(
      (result) => {
        const dates = result.rows.slice(1);
        hedge.path = {
          kind: 'spots',
          spots: dates.map((row, i) => (typeof typed[i] === 'number' ? typed[i] : Number(row.spot.toPrecision(6)))),
        };
        render();
        changed(0);
      },
      (err) => {
        if (err instanceof EngineError) showError(err.field, err.message, err.detail);
      },
    );
  }

  function rebalanceFields() {
    const unit = select('hedge.rebalance.unit', [
      ['', 'weeks (default)'],
      ['days', 'business days'],
      ['weeks', 'weeks'],
      ['months', 'months'],
    ]);
    return fieldRow([
      ...boundFields([
        ['Rebalance every', 'hedge.rebalance.every', 'number', { placeholder: '1', inputMode: 'numeric' }],
      ]),
      field('Unit', unit),
    ]);
  }

  /** Steps on a tree: how many, and each step up or down. */
  function latticeControls(doc) {
    const moves = movesOf(doc);
    const steps = make('input', { type: 'number', min: 1, max: maxTreeSteps, value: moves.length, id: 'hedge-steps' });
    steps.addEventListener('change', () => {
      const n = Math.max(1, Math.min(maxTreeSteps, Math.round(Number(steps.value)) || 1));
      setMoves(moves.length >= n ? moves.slice(0, n) : moves + 'UD'.repeat(n).slice(0, n - moves.length));
    });
    const buttons = make('div', {
      className: 'path-buttons',
      role: 'group',
      'aria-label': 'Moves of spot, step by step',
    });
    [...moves].forEach((m, i) => {
      const up = m === 'U';
      const flip = () => {
        setMoves(moves.slice(0, i) + (up ? 'D' : 'U') + moves.slice(i + 1));
        controls.querySelectorAll('.move')[i]?.focus();
      };
      buttons.append(
        button(up ? '▲' : '▼', flip, {
          className: `move ${up ? 'up' : 'down'}`,
          title: `Step ${i + 1}: ${up ? 'up' : 'down'} (click to turn ${up ? 'down' : 'up'})`,
          'aria-label': `Step ${i + 1}: ${up ? 'up' : 'down'}`,
          'aria-pressed': up ? 'true' : 'false',
        }),
      );
    });
    return [
      fieldRow([field(`Tree steps (1–${maxTreeSteps})`, steps)]),
      make('p', {
        className: 'hint',
        text: 'Each step is one lattice period. Press a step to flip it up or down, or pick a node on the tree.',
      }),
      buttons,
      errorLine('hedge.path.moves'),
    ];
  }

  /** Spots typed per rebalancing date, each labelled with its date from the last schedule. */
  function spotsControls(doc) {
    const spots = Array.isArray(doc.hedge?.path?.spots) ? doc.hedge.path.spots : [];
    const list = make('div', { className: 'spot-list' });
    spots.forEach((_, i) => {
      const date =
        lastRows[i + 1]?.date ?? (lastRows[i + 1] ? `${formatNumber(lastRows[i + 1].years, 3)} y` : `date ${i + 1}`);
      list.append(field(String(date), bound(`hedge.path.spots[${i}]`, 'number'), 'field cell'));
    });
    const fit = button('One spot per date', fitSpots, { className: 'small' });
    return [
      rebalanceFields(),
      make('div', { className: 'list-head' }, [make('span', { text: 'Spot on each rebalancing date' }), fit]),
      list,
      errorLine('hedge.path.spots'),
    ];
  }

  /** A random path: its drift, realised volatility and seed. */
  function scenarioControls() {
    return [
      rebalanceFields(),
      fieldRow(
        boundFields([
          ['Drift % p.a.', 'hedge.path.drift', 'percent', { placeholder: 'the rate' }],
          ['Realised vol % p.a.', 'hedge.path.volatility', 'percent', { placeholder: 'as priced' }],
          ['Seed', 'hedge.path.seed', 'number', { placeholder: '1', inputMode: 'numeric' }],
        ]),
      ),
    ];
  }

  /** A stress: its shape, size and, for a gap, the date. */
  function stressControls(doc) {
    const shape = select('hedge.path.shape', [
      ['fall', 'steady fall'],
      ['rise', 'steady rise'],
      ['gap-down', 'gap down on a date'],
    ]);
    const row = [field('Shape', shape), field('Size %', bound('hedge.path.change', 'percent'))];
    if (doc.hedge?.path?.shape === 'gap-down') {
      row.push(field('Gap date or years', whenInput('hedge.path', 'date,years')));
    }
    return [rebalanceFields(), fieldRow(row)];
  }

  const pathControls = {
    lattice: latticeControls,
    spots: spotsControls,
    scenario: scenarioControls,
    stress: stressControls,
  };

  /** Build the controls for the current kind of path. */
  function render() {
    if (!has()) return;
    const doc = state.doc;
    const kind = pathKind(doc);
    const choice = make('fieldset', { className: 'field choice-field' }, [make('legend', { text: 'Path of spot' })]);
    for (const [value, text] of kinds) {
      const radio = make('input', { type: 'radio', name: 'hedge-kind', value, checked: value === kind });
      radio.addEventListener('change', () => setKind(value));
      choice.append(make('label', {}, [radio, ` ${text}`]));
    }
    const parts = [
      choice,
      ...pathControls[kind](doc),
      fieldRow(boundFields([['Trading cost, bp of traded value', 'hedge.cost_bp', 'number', { placeholder: '0' }]])),
      errorLine('hedge'),
    ];
    showControls(controls, parts, doc, bindControls);
    treeHost.hidden = kind !== 'lattice';
  }

  function drawSchedule(result) {
    const digits = priceDigits(state.doc);
    // a pair's hedge holds foreign currency (docs/currency.md): its words name it
    const held = isPair(state.doc) ? `${pairCodes(state.doc).base}` : 'Shares';
    const heldWord = isPair(state.doc) ? held : 'shares'; // in a sentence: a currency code keeps its capitals
    const head = [
      'Date',
      'Event',
      'Spot',
      'Option value',
      'Target delta',
      `${held} held`,
      `${held} traded`,
      'Cash',
      'Portfolio',
      'Portfolio − option',
    ];
    const rows = result.rows.map((row) => [
      row.date ?? `${formatNumber(row.years, 3)} y`,
      row.event,
      formatNumber(row.spot, digits),
      formatNumber(row.option_value, 4),
      row.delta === null ? '–' : formatNumber(row.delta, 4),
      formatNumber(row.shares_held ?? row.foreign_held, 4),
      formatNumber(row.shares_traded ?? row.foreign_traded, 4),
      formatNumber(row.cash, 4),
      formatNumber(row.portfolio_value, 4),
      formatSmart(row.tracking_error, 2, 4),
    ]);
    fillTable(table, head, rows, 'Hedge schedule per unit of the trade');
    table.dataset.rows = String(result.rows.length);
    const t = result.totals;
    const desk = result.desk;
    byId('hedge-totals').textContent =
      `Per unit: the premium ${formatNumber(t.premium, 4)} grew into a portfolio of ${formatNumber(t.portfolio_value, 4)} against ${formatNumber(t.payoff, 4)} owed at the end (${t.end_event}); ` +
      `replication error ${formatSmart(t.replication_error, 2, 4)}, ${heldWord} traded ${formatNumber(t.total_shares_traded ?? t.total_foreign_traded, 4)}, costs ${formatNumber(t.total_costs, 4)}. ` +
      `The desk holds ${formatNumber(desk.shares_at_start ?? desk.foreign_at_start, 0)} ${heldWord} at the start and ${formatNumber(desk.shares_at_end ?? desk.foreign_at_end, 0)} at the end; its hedged P&L is ${formatNumber(desk.pnl, 2)}.` +
      (result.notes?.length ? ` Note: ${result.notes.map(screenNote).join('; ')}.` : '');
    const xs = (row) => row.years;
    drawChart(byId('hedge-chart'), {
      series: [
        {
          kind: 'portfolio',
          label: `Hedge portfolio (${heldWord} + cash)`,
          dots: true,
          points: result.rows.map((r) => [xs(r), r.portfolio_value]),
        },
        { kind: 'option', label: 'Option value', dots: true, points: result.rows.map((r) => [xs(r), r.option_value]) },
      ],
      xLabel: 'Years from valuation',
      yLabel: 'Value per unit',
      height: 240,
    });
  }

  return {
    ...cardBasics(elements, render),
    /** Start the `hedge` call for `doc` now (it queues behind the price on the engine); null if the page has no hedge card. */
    request(doc) {
      return has() ? started(live.call('hedge', doc)) : null;
    },
    /** Show the schedule `pending` (from request) brings, unless a newer edit came first; returns it, or null. */
    async update(doc, price, generation, pending) {
      if (!pending) return null;
      const kind = pathKind(doc);
      try {
        const result = await pending;
        if (generation !== state.generation) return null;
        lastRows = result.rows;
        drawSchedule(result);
        if (kind === 'spots') {
          // dates beside the typed spots follow the schedule
          // (the label's own text, not the error line the field also holds)
          controls.querySelectorAll('.spot-list .field > span:first-child').forEach((span, i) => {
            const row = result.rows[i + 1];
            if (row) span.textContent = row.date ?? `${formatNumber(row.years, 3)} y`;
          });
        }
        if (kind === 'lattice' && hasTree()) {
          lastTree = await live.call('tree', doc);
          if (generation !== state.generation) return null;
          drawTree(treeHost, lastTree, movesOf(doc), setMoves, priceDigits(doc));
        }
        setStale(['hedge'], false);
        return result;
      } catch (err) {
        if (generation !== state.generation || err instanceof Cancelled) return null;
        setStale(['hedge'], true);
        if (err instanceof EngineError) showError(err.field, err.message, err.detail);
        else showError('', `The hedge could not be computed: ${err.message}`);
        return null;
      }
    },
    /** Show a schedule kept from before a reload (recompute.js marks it as such). */
    showSchedule(result) {
      lastRows = result.rows;
      drawSchedule(result);
    },
  };
}
