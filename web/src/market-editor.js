// Hedgeleaf page: the market editor — a volatility grid by expiry and strike, and the rate,
// dividend-yield and borrow curves as tenor -> rate tables (docs/market.md).
//
// Defaults stay simple: one volatility and one rate in the Underlying group. "Smile grid"
// turns the volatility into a grid seeded with that one number (a flat grid prices exactly as
// the number), "By tenor" does the same for a curve; "Back to one ..." returns to a number and
// keeps the grid or curve aside, so opening it again brings back what was typed. Every cell is
// a bound input (data-path), so typing, autosave, the page's own checks and the engine's
// messages beside the cell work as for any field; volatilities and rates are in percent on
// screen and decimals in the file. A block pasted from a spreadsheet fills the grid (paste-block.js).
import { bound, byId, button, errorLine, field, make, removeButton, select } from './dom.js';
import { setPath } from './paths.js';
import { readCurveBlock, readGridBlock } from './paste-block.js';
import { tabObject } from './state.js';

export const curveNames = {
  rate: 'Interest rate',
  carry_yield: 'Dividend yield',
  borrow: 'Borrow fee',
};
const basisChoices = [
  ['', '% of spot'],
  ['percent_of_forward', '% of the forward'],
  ['absolute', 'price'],
];
const seedExpiries = ['3m', '6m', '1y'];
const seedStrikes = [80, 90, 100, 110, 120];
const seedTenors = ['3m', '1y', '2y'];

/** A volatility (or curve) given as an object rather than one number. */
export const isTable = (value) => value !== null && typeof value === 'object' && !Array.isArray(value);

/** The expiry after `last` for a new row: one more year, twice the months, a year on from a date. */
function nextExpiry(last) {
  if (typeof last === 'number') return last + 1;
  const tenor = /^(\d+)([dwmy])$/.exec(String(last ?? ''));
  if (tenor) return tenor[2] === 'y' ? `${Number(tenor[1]) + 1}y` : `${Number(tenor[1]) * 2}${tenor[2]}`;
  const date = /^(\d{4})(-\d{2}-\d{2})$/.exec(String(last ?? ''));
  return date ? `${Number(date[1]) + 1}${date[2]}` : '';
}

/** The strike after the last two for a new column: the same step again (or 10 % more). */
function nextStrike(strikes) {
  const [a, b] = strikes.slice(-2);
  if (typeof b !== 'number') return typeof a === 'number' ? a * 1.1 : 100;
  return typeof a === 'number' && b > a ? Number((2 * b - a).toPrecision(12)) : Number((b * 1.1).toPrecision(12));
}

/**
 * The market editor over `state.doc.market`. `refill` draws every input again, `changed`
 * recomputes; `announce(text)` says what a paste did (politely, to screen readers too).
 */
export function marketEditor({ state, refill, changed, announce }) {
  // Grids and curves put away by "Back to one ...", by field: kept in this tab (through reloads)
  // until opened again, so going back to one number never loses a grid that was typed.
  const { value: aside, keep: keepAside } = tabObject('hedgeleaf.market.aside');

  const market = () => (state.doc.market ??= {});

  /** Redraw and recompute after the editor changed the document; focus `selector` in the new form. */
  function edited(selector) {
    refill();
    changed();
    if (selector) byId('terms').querySelector(selector)?.focus();
  }

  // ----- the volatility grid -----

  function openGrid() {
    const flat = typeof market().volatility === 'number' ? market().volatility : 0.25;
    const kept = aside.volatility;
    market().volatility = kept ?? {
      expiries: [...seedExpiries],
      strikes: [...seedStrikes],
      vols: seedExpiries.map(() => seedStrikes.map(() => flat)),
    };
    delete aside.volatility;
    keepAside();
    edited('.vol-grid input');
    if (kept) announce('The grid put aside is back.');
  }

  /** Back to one volatility: the one the first leg was priced at, else the grid's middle; the grid is kept aside. */
  function closeGrid() {
    const grid = market().volatility;
    const used = state.price?.legs?.find((leg) => leg.market)?.market?.volatility;
    const row = Array.isArray(grid.vols) ? grid.vols[0] : null;
    const middle = Array.isArray(row) ? row[Math.floor(row.length / 2)] : null;
    aside.volatility = grid;
    keepAside();
    market().volatility = typeof used === 'number' ? used : typeof middle === 'number' ? middle : 0.25;
    edited('[data-path="market.volatility"]');
  }

  function addExpiry() {
    const grid = market().volatility;
    grid.expiries.push(nextExpiry(grid.expiries.at(-1)));
    grid.vols.push([...(grid.vols.at(-1) ?? grid.strikes.map(() => 0.25))]);
    edited(`[data-path="market.volatility.expiries[${grid.expiries.length - 1}]"]`);
  }

  function addStrike() {
    const grid = market().volatility;
    grid.strikes.push(nextStrike(grid.strikes));
    for (const row of grid.vols) if (Array.isArray(row)) row.push(row.at(-1) ?? 0.25);
    edited(`[data-path="market.volatility.strikes[${grid.strikes.length - 1}]"]`);
  }

  function removeExpiry(i) {
    const grid = market().volatility;
    grid.expiries.splice(i, 1);
    grid.vols.splice(i, 1);
    edited('.add-expiry');
  }

  function removeStrike(j) {
    const grid = market().volatility;
    grid.strikes.splice(j, 1);
    for (const row of grid.vols) if (Array.isArray(row)) row.splice(j, 1);
    edited('.add-strike');
  }

  /** A grid given as table text (a file may hold one) becomes lists the editor can show. */
  function gridLists(grid) {
    if (typeof grid.table !== 'string' || grid.expiries !== undefined) return grid;
    const read = readGridBlock(grid.table);
    if (read.why || !read.expiries || !read.strikes) return grid;
    const { table: _table, ...rest } = grid;
    const lists = { ...rest, expiries: read.expiries, strikes: read.strikes, vols: read.vols };
    market().volatility = lists;
    return lists;
  }

  function gridTable(grid) {
    const strikes = Array.isArray(grid.strikes) ? grid.strikes : [];
    const expiries = Array.isArray(grid.expiries) ? grid.expiries : [];
    const head = make('tr', {}, [
      make('th', { scope: 'col', text: 'Expiry \\ strike' }),
      ...strikes.map((_, j) =>
        make('th', { scope: 'col', className: 'cell' }, [
          bound(`market.volatility.strikes[${j}]`, 'number', { 'aria-label': `Strike, column ${j + 1}` }),
          removeButton(`Remove column ${j + 1}`, () => removeStrike(j)),
        ]),
      ),
    ]);
    const rows = expiries.map((_, i) =>
      make('tr', {}, [
        make('th', { scope: 'row', className: 'cell' }, [
          bound(`market.volatility.expiries[${i}]`, 'time', {
            'aria-label': `Expiry, row ${i + 1}`,
            inputMode: 'text',
          }),
          removeButton(`Remove row ${i + 1}`, () => removeExpiry(i)),
        ]),
        ...strikes.map((_, j) =>
          make('td', { className: 'cell' }, [
            bound(`market.volatility.vols[${i}][${j}]`, 'percent', {
              'aria-label': `Volatility, row ${i + 1}, column ${j + 1}`,
            }),
          ]),
        ),
      ]),
    );
    for (const node of [...rows.flatMap((r) => [...r.querySelectorAll('.remove')])])
      node.disabled = expiries.length < 2;
    for (const node of head.querySelectorAll('.remove')) node.disabled = strikes.length < 2;
    const table = make('table', { className: 'vol-grid' }, [
      make('caption', { text: 'Volatility, % a year: one row per expiry, one column per strike' }),
      make('thead', {}, [head]),
      make('tbody', {}, rows),
    ]);
    table.addEventListener('paste', pasteIntoGrid);
    return table;
  }

  function renderSmile() {
    const holder = byId('smile-editor');
    const volatility = state.doc.market?.volatility;
    const gridOn = isTable(volatility);
    byId('volatility-field').hidden = gridOn;
    byId('smile-open').hidden = gridOn;
    if (!gridOn) {
      holder.replaceChildren();
      return;
    }
    const grid = gridLists(volatility);
    holder.replaceChildren(
      make('div', { className: 'row' }, [field('Strikes as', select('market.volatility.strike_basis', basisChoices))]),
      make('div', { className: 'table-scroll', tabIndex: 0, role: 'region', 'aria-label': 'Volatility grid' }, [
        gridTable(grid),
      ]),
      make('div', { className: 'list-head' }, [
        button('Add expiry', addExpiry, { className: 'small add-expiry' }),
        button('Add strike', addStrike, { className: 'small add-strike' }),
        button('Back to one volatility', closeGrid, { className: 'small' }),
      ]),
      make('p', {
        className: 'hint',
        text: 'Years (0.5), tenors (6m) or dates down the side; strikes across. Paste a block copied from a spreadsheet into a cell: with its strikes and expiries it replaces the grid, without them it fills from that cell.',
      }),
      errorLine('market.volatility'),
    );
  }

  /** A spreadsheet block pasted into the grid: the whole grid with its headings, else the cells from the one pasted into. */
  function pasteIntoGrid(event) {
    const text = event.clipboardData?.getData('text/plain') ?? '';
    if (!/[\t\n]/.test(text.trim())) return; // one value: an ordinary paste into the cell
    event.preventDefault();
    const read = readGridBlock(text);
    if (read.why) return announce(`Nothing pasted: ${read.why}.`);
    const grid = market().volatility;
    const units = read.decimals ? ' (volatilities read as decimals: 0.25 = 25 %)' : '';
    if (read.expiries && read.strikes) {
      Object.assign(grid, { expiries: read.expiries, strikes: read.strikes, vols: read.vols });
      edited('.vol-grid td input');
      return announce(`Pasted a grid of ${read.rows} expiries by ${read.strikes.length} strikes${units}.`);
    }
    const at = /^market\.volatility\.(?:vols\[(\d+)\]\[(\d+)\]|expiries\[(\d+)\])$/.exec(
      event.target.dataset?.path ?? '',
    );
    const top = Number(at?.[1] ?? at?.[3] ?? 0);
    const left = at?.[2] !== undefined ? Number(at[2]) : 0;
    let written = 0;
    read.vols.forEach((row, i) => {
      if (read.expiries && top + i < grid.expiries.length) grid.expiries[top + i] = read.expiries[i];
      row.forEach((value, j) => {
        if (top + i >= grid.vols.length || left + j >= grid.strikes.length) return;
        setPath(state.doc, `market.volatility.vols[${top + i}][${left + j}]`, value);
        written += 1;
      });
    });
    const cells = read.vols.flat().length;
    edited(event.target.dataset?.path ? `[data-path="${event.target.dataset.path}"]` : null);
    announce(
      `Pasted ${written} volatilit${written === 1 ? 'y' : 'ies'} from row ${top + 1}, column ${left + 1}${units}` +
        (written < cells ? `; ${cells - written} fell outside the grid (add rows or columns first).` : '.'),
    );
  }

  // ----- the curves -----

  function openCurve(name) {
    const flat = typeof market()[name] === 'number' ? market()[name] : 0;
    market()[name] = aside[name] ?? { points: seedTenors.map((tenor) => ({ tenor, rate: flat })) };
    delete aside[name];
    keepAside();
    edited(`[data-curve="${name}"] input`);
  }

  /** Back to one rate: the first point's (the curve kept aside for when it is opened again). */
  function closeCurve(name) {
    const curve = market()[name];
    const first = Array.isArray(curve.points) ? curve.points[0]?.rate : undefined;
    aside[name] = curve;
    keepAside();
    if (typeof first === 'number' && !(name === 'borrow' && first === 0)) market()[name] = first;
    else delete market()[name];
    edited(`[data-curve-open="${name}"]`);
  }

  function addPoint(name) {
    const points = market()[name].points;
    const last = points.at(-1) ?? {};
    const time = last.tenor ?? last.date ?? last.years;
    const key = last.date !== undefined ? 'date' : last.years !== undefined ? 'years' : 'tenor';
    points.push({ [key]: nextExpiry(time) || '1y', rate: typeof last.rate === 'number' ? last.rate : 0 });
    edited(`[data-curve="${name}"] tr:last-child input`);
  }

  function removePoint(name, i) {
    market()[name].points.splice(i, 1);
    edited(`[data-curve="${name}"] .add-point`);
  }

  function curveTable(name, curve) {
    const points = Array.isArray(curve.points) ? curve.points : [];
    const base = `market.${name}.points`;
    const rows = points.map((_, i) => {
      const time = make('input', {
        dataset: { role: 'point-time', base: `${base}[${i}]`, kind: 'time' },
        autocomplete: 'off',
        'aria-label': `${curveNames[name]}, point ${i + 1}: tenor, date or years`,
      });
      const pointError = errorLine(`${base}[${i}]`);
      pointError.errorInput = time; // a refusal of the point (its order) is about its time, in its name
      return make('tr', {}, [
        make('td', { className: 'cell' }, [time]),
        make('td', { className: 'cell' }, [
          bound(`${base}[${i}].rate`, 'percent', { 'aria-label': `${curveNames[name]}, point ${i + 1}: rate` }),
          pointError,
        ]),
        make('td', {}, [
          removeButton(`Remove ${curveNames[name].toLowerCase()} point ${i + 1}`, () => removePoint(name, i)),
        ]),
      ]);
    });
    const table = make('table', { className: 'curve-table' }, [
      make('caption', { text: `${curveNames[name]} by tenor, % a year (continuously compounded)` }),
      make('thead', {}, [
        make(
          'tr',
          {},
          ['Tenor, date or years', 'Rate %', ''].map((text) => make('th', { scope: 'col', text })),
        ),
      ]),
      make('tbody', {}, rows),
    ]);
    table.addEventListener('paste', (event) => pasteIntoCurve(event, name));
    return make('div', { className: 'curve', dataset: { curve: name } }, [
      table,
      make('div', { className: 'list-head' }, [
        button('Add point', () => addPoint(name), { className: 'small add-point' }),
        button(`Back to one ${name === 'borrow' ? 'fee' : 'rate'}`, () => closeCurve(name), { className: 'small' }),
      ]),
      errorLine(`market.${name}`),
    ]);
  }

  function pasteIntoCurve(event, name) {
    const text = event.clipboardData?.getData('text/plain') ?? '';
    if (!/[\t\n]/.test(text.trim())) return;
    event.preventDefault();
    const read = readCurveBlock(text);
    if (read.why) return announce(`Nothing pasted: ${read.why}.`);
    market()[name].points = read.points.map(({ time, rate }) => {
      const key = typeof time === 'number' ? 'years' : /^\d{4}-/.test(time) ? 'date' : 'tenor';
      return { [key]: time, rate };
    });
    edited(`[data-curve="${name}"] input`);
    const units = read.decimals ? ' (rates read as decimals: 0.03 = 3 %)' : '';
    announce(`Pasted ${read.points.length} points of the ${curveNames[name].toLowerCase()} curve${units}.`);
  }

  function renderCurves() {
    for (const name of Object.keys(curveNames)) {
      const value = state.doc.market?.[name];
      const on = isTable(value);
      const flatField = byId(`${name}-field`);
      if (flatField) flatField.hidden = on;
      byId(`${name}-curve-open`).hidden = on;
      byId(`${name}-curve`).replaceChildren(...(on ? [curveTable(name, value)] : []));
    }
  }

  /** Show the grid and the curves the trade has (a borrow fee opens its folded group, so what the trade holds is seen). */
  function fill() {
    renderSmile();
    renderCurves();
    if (state.doc.market?.borrow !== undefined) byId('market-more').open = true;
  }

  function wire() {
    byId('smile-open').addEventListener('click', openGrid);
    for (const name of Object.keys(curveNames))
      byId(`${name}-curve-open`).addEventListener('click', () => openCurve(name));
    // an emptied cell stays in the grid as empty (refused beside it), never silently the old value
    byId('terms').addEventListener('input', (event) => {
      const path = event.target.dataset?.path ?? '';
      if (/^market\.volatility\.(vols|expiries|strikes)\[/.test(path) && event.target.value.trim() === '')
        setPath(state.doc, path, '');
    });
  }

  return { fill, wire, gridOf: () => (isTable(state.doc.market?.volatility) ? state.doc.market.volatility : null) };
}
