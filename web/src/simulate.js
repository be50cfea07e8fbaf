// Hedgeleaf page: the discrete-hedging simulation, on its own Web Worker.
//
// Settings live in the trade's `simulate` section (core/simulate.hpp), so the
// CLI gives the same figures for the exported file. A run is one engine call;
// Cancel terminates its worker. The engine reports no progress from inside the
// call, so the bar shows elapsed time against an estimate from the last run
// (indeterminate on the first).
import { cardBasics, cardParts, showControls } from './card.js';
import { drawChart } from './chart.js';
import { Cancelled, EngineChannel } from './compute.js';
import { isPair } from './currency.js';
import { boundFields, button, errorLine, fieldRow, fillTable, make, scrollRegion } from './dom.js';
import { EngineError } from './engine.js';
import { formatNumber, formatSmart, inputText } from './format.js';

const units = [
  ['days', 'Every business day'],
  ['weeks', 'Every week'],
  ['months', 'Every month'],
];

/** "every 1 weeks" -> "Every week"; other wording as the engine gives it. */
function frequencyName(text) {
  const plain = {
    'every 1 business days': 'Every business day',
    'every 1 weeks': 'Every week',
    'every 1 months': 'Every month',
  };
  return plain[text] ?? text;
}

/** Which of the three usual frequencies the section asks for (absent = all three). */
function chosenUnits(doc) {
  const list = doc.simulate?.frequencies;
  if (!Array.isArray(list)) return new Set(units.map(([u]) => u));
  return new Set(list.filter((f) => f && (f.every ?? 1) === 1).map((f) => f.unit ?? 'weeks'));
}

/** The simulation card. */
export function simulatePanel({
  makeWorker,
  mainThreadFactory,
  state,
  showError,
  clearErrors,
  setStale,
  changed,
  bindControls,
}) {
  const elements = cardParts('simulate', state);
  const { card, controls, output, has } = elements;
  const channel = new EngineChannel(makeWorker, mainThreadFactory);
  let msPerPath = null; // from the last finished run
  let ranOn = null; // the document text of the run on screen
  let timer = null;

  function section() {
    if (!state.doc.simulate || typeof state.doc.simulate !== 'object' || Array.isArray(state.doc.simulate))
      state.doc.simulate = {};
    return state.doc.simulate;
  }

  function setUnits(chosen) {
    const s = section();
    if (chosen.size === units.length) delete s.frequencies;
    else s.frequencies = units.filter(([u]) => chosen.has(u)).map(([unit]) => ({ every: 1, unit }));
    if (Object.keys(s).length === 0) delete state.doc.simulate;
    changed();
  }

  const run = button('Run simulation', start, { className: 'primary', id: 'simulate-run' });
  const cancel = button('Cancel', () => channel.cancel(), { id: 'simulate-cancel', disabled: true });
  const progress = make('progress', { max: 1, id: 'simulate-progress' });
  const status = make('p', { className: 'hint', id: 'simulate-status', role: 'status' });
  progress.hidden = true;
  status.textContent =
    'Not run yet. Run simulation hedges many random paths (10,000 by default) and shows the spread of the hedge’s P&L here.';

  function render() {
    if (!has()) return;
    const chosen = chosenUnits(state.doc);
    const boxes = make('fieldset', { className: 'field choice-field' }, [make('legend', { text: 'Rebalance' })]);
    for (const [unit, text] of units) {
      const box = make('input', { type: 'checkbox', checked: chosen.has(unit), value: unit });
      box.addEventListener('change', () => {
        const next = chosenUnits(state.doc);
        if (box.checked) next.add(unit);
        else next.delete(unit);
        if (next.size === 0) {
          box.checked = true;
          return;
        }
        setUnits(next);
      });
      boxes.append(make('label', {}, [box, ` ${text}`]));
    }
    showControls(
      controls,
      [
        make('p', {
          className: 'hint',
          text: `Many random spot paths, each hedged in ${isPair(state.doc) ? 'foreign currency' : 'shares'} on the chosen dates: how far the hedge ends from what the trade pays (per unit; the desk that sold the trade keeps this).`,
        }),
        fieldRow(
          boundFields([
            ['Paths', 'simulate.paths', 'number', { placeholder: '10,000', inputMode: 'numeric' }],
            ['Realised vol % p.a.', 'simulate.volatility', 'percent', { placeholder: 'as priced' }],
            ['Drift % p.a.', 'simulate.drift', 'percent', { placeholder: 'the rate' }],
          ]),
        ),
        fieldRow([
          ...boundFields([
            ['Trading cost, bp', 'simulate.cost_bp', 'number', { placeholder: '0' }],
            ['Seed', 'simulate.seed', 'number', { placeholder: '1', inputMode: 'numeric' }],
          ]),
          boxes,
        ]),
        errorLine('simulate'),
        make('div', { className: 'path-buttons' }, [run, cancel]),
        progress,
        status,
      ],
      state.doc,
      bindControls,
    );
  }

  function finish() {
    clearInterval(timer);
    run.disabled = false;
    cancel.disabled = true;
    progress.hidden = true;
    card.classList.remove('running');
  }

  async function start() {
    const doc = structuredClone(state.doc);
    const paths = typeof doc.simulate?.paths === 'number' ? doc.simulate.paths : 10000;
    const began = performance.now();
    const estimate = msPerPath ? msPerPath * paths : null;
    run.disabled = true;
    cancel.disabled = false;
    progress.hidden = false;
    card.classList.add('running');
    if (estimate) progress.value = 0;
    else progress.removeAttribute('value'); // indeterminate until one run has been timed
    const tick = () => {
      const elapsed = (performance.now() - began) / 1000;
      if (estimate) progress.value = Math.min(0.97, (elapsed * 1000) / estimate);
      status.textContent = `Simulating ${inputText(paths)} paths… ${elapsed.toFixed(1)} s${estimate ? `, about ${Math.max(0, estimate / 1000 - elapsed).toFixed(1)} s left` : ''}`;
    };
    tick();
    timer = setInterval(tick, 100);
    clearErrors(['simulate']);
    try {
      const result = await channel.call('simulate', doc);
      msPerPath = (performance.now() - began) / paths;
      finish();
      ranOn = JSON.stringify(doc);
      status.textContent = `Done: ${inputText(result.paths)} paths in ${((performance.now() - began) / 1000).toFixed(1)} s.`;
      draw(result);
      setStale(['simulate'], false);
    } catch (err) {
      finish();
      if (err instanceof Cancelled) status.textContent = 'Cancelled. Nothing was changed.';
      else if (err instanceof EngineError) {
        status.textContent = 'Not run: see the message above.';
        showError(err.field, err.message, err.detail);
      } else status.textContent = `The simulation failed: ${err.message}`;
    }
  }

  function draw(result) {
    const head = [
      'Rebalancing',
      'Trades',
      'Mean P&L',
      'Spread (sd)',
      '5 % worst',
      'Median',
      '5 % best',
      'Mean costs',
      'Desk sd (position)',
    ];
    const rows = result.rows.map((row) => [
      frequencyName(row.frequency),
      inputText(row.rebalancings),
      formatSmart(row.mean, 3, 4),
      `${formatNumber(row.sd, 4)} ± ${formatSmart(2 * row.sd_standard_error, 1, 4)}`,
      formatNumber(row.p05, 4),
      formatNumber(row.p50, 4),
      formatNumber(row.p95, 4),
      formatNumber(row.mean_costs, 4),
      formatNumber(row.desk_sd, 2),
    ]);
    const table = fillTable(make('table', { className: 'figures', dataset: { result: 'simulation' } }), head, rows);
    const edges = result.histogram.edges;
    const width = edges[1] - edges[0];
    const series = result.histogram.series.map((s, i) => ({
      kind: `freq${i}`,
      label: frequencyName(s.frequency),
      points: s.counts.map((c, k) => [(edges[k] + edges[k + 1]) / 2, c / result.paths / width]),
    }));
    const chart = make('div', {
      className: 'chart',
      role: 'figure',
      'aria-label': 'Distribution of the hedging P&L per unit',
    });
    output.replaceChildren(
      scrollRegion('Simulation results', table),
      chart,
      make('p', {
        className: 'hint',
        text: `P&L per unit = hedge portfolio − payoff; ${result.monte_carlo_error}. Premium ${formatNumber(result.premium, 4)}, pricing volatility ${formatNumber(100 * result.pricing_volatility, 2)} %, realised ${formatNumber(100 * result.volatility, 2)} %.`,
      }),
    );
    drawChart(chart, { series, xLabel: 'P&L per unit at the end', yLabel: 'Density', height: 220 });
  }

  return {
    ...cardBasics(elements, render),
    update(doc) {
      if (ranOn === null) {
        setStale(['simulate'], false); // nothing run yet: nothing on the card is out of date
        return;
      }
      const stale = JSON.stringify(doc) !== ranOn;
      setStale(['simulate'], stale);
      if (stale && !card.classList.contains('running'))
        status.textContent = 'The trade or settings changed since this run: run again to update.';
    },
  };
}
