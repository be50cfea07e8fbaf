// Hedgeleaf page: the trade-terms form (market, dividends, contract and legs).
//
// The fixed inputs are in index.html; the rows that follow the document (cash
// dividends, structure strikes, own legs) are drawn here from it, and fields
// are shown or hidden by the kind of contract. Reading and writing single
// inputs is form.js's job; this file decides what the form shows.
import { addYears } from './dates.js';
import { bound, byId, field, make, removeButton, select, whenInput } from './dom.js';
import {
  changeShape,
  contractExpiry,
  contractKey,
  exerciseNames,
  fillInput,
  shapes,
  switchExpiryMode,
} from './form.js';

const strikeNames = {
  1: ['Strike'],
  2: ['Lower strike', 'Upper strike'],
  3: ['Low strike', 'Middle strike', 'High strike'],
};
const legTypes = [
  ['call', 'Call'],
  ['put', 'Put'],
  ['digital-call', 'Digital call'],
  ['digital-put', 'Digital put'],
  ['stock', 'Share'],
];
const exerciseStyles = Object.entries(exerciseNames);
const marginLabels = {
  absolute: 'Margin per unit',
  fraction_of_premium: 'Margin, % of premium',
  volatility: 'Margin, vol points',
};
const whenHint = { placeholder: 'YYYY-MM-DD or years' };

/**
 * The terms form over `state.doc`. An edit that adds or removes rows calls `refill`
 * (draw the whole page's inputs again) and `changed` (recompute soon).
 */
export function termsForm({ form, state, refill, changed }) {
  let chosenMode = 'date'; // how the expiry is given when the trade has none yet
  const aside = {}; // an expiry the page could not convert, kept for when its way is chosen again

  /** Draw the rows the document has and show its values in every input of the form. */
  function fill() {
    renderContract();
    renderDividends();
    for (const input of form.querySelectorAll('[data-path], [data-role]')) fillInput(state.doc, input);
    const expiry = contractExpiry(state.doc);
    const mode = expiry.expiry_years !== undefined ? 'tenor' : expiry.expiry_date !== undefined ? 'date' : chosenMode;
    for (const radio of form.querySelectorAll('input[name="expiry-mode"]')) radio.checked = radio.value === mode;
    updateVisibility();
  }

  /** The expiry is to be given as `mode` ("date" or "tenor"): convert it, never losing it. */
  function switchExpiry(mode) {
    chosenMode = mode;
    switchExpiryMode(state.doc, mode, aside);
    refill();
    changed();
  }

  function updateVisibility() {
    const key = contractKey(state.doc);
    const holder = key === 'legs' ? null : state.doc[key] || {};
    const mode = form.querySelector('input[name="expiry-mode"]:checked')?.value ?? 'date';
    byId('single-terms').hidden = key !== 'option';
    byId('structure-strikes').hidden = key !== 'structure';
    byId('legs-editor').hidden = key !== 'legs';
    byId('shared-terms').hidden = key === 'legs';
    byId('payout-field').hidden = !(key === 'option' && String(holder?.type).startsWith('digital'));
    byId('expiry-date-field').hidden = mode !== 'date';
    byId('expiry-tenor-field').hidden = mode !== 'tenor';
    byId('exercise-dates-field').hidden = holder?.exercise !== 'bermudan';
    updateMarginField();
    const bermudan = form.querySelector('[data-role="exercise"] option[value="bermudan"]');
    bermudan.disabled = key === 'structure';
    const shape = key === 'structure' ? holder.shape : key;
    byId('shape').value = shape in shapes || shape === 'option' || shape === 'legs' ? shape : 'option';
    byId('shape-hint').textContent =
      key === 'structure'
        ? (shapes[holder.shape]?.[1] ?? '')
        : key === 'legs'
          ? 'Each leg is its own option with a signed quantity per unit of the structure.'
          : '';
  }

  /** The margin is typed in price units, percent of the premium or volatility points, by its type. */
  function updateMarginField() {
    const type = state.doc.quote?.margin_type ?? 'absolute';
    const input = byId('margin-input');
    input.dataset.kind = type === 'absolute' ? 'number' : 'percent';
    byId('margin-label').textContent = marginLabels[type] ?? 'Margin';
    fillInput(state.doc, input);
  }

  /** A row's remove button: `remove` takes its entry out of the document, then the page redraws and recomputes. */
  function removeRow(remove) {
    return () => {
      remove();
      refill();
      changed();
    };
  }

  function renderDividends() {
    const list = Array.isArray(state.doc.market?.dividends) ? state.doc.market.dividends : [];
    byId('dividend-rows').replaceChildren(
      ...list.map((_, i) =>
        make('div', { className: 'row list-row' }, [
          field(`Dividend ${i + 1}: pay date`, whenInput(`market.dividends[${i}]`, 'date,time_years', whenHint)),
          field('Cash per share', bound(`market.dividends[${i}].amount`, 'number')),
          removeButton(
            `Remove dividend ${i + 1}`,
            removeRow(() => {
              state.doc.market.dividends.splice(i, 1);
              if (state.doc.market.dividends.length === 0) delete state.doc.market.dividends;
            }),
          ),
        ]),
      ),
    );
  }

  function renderContract() {
    const key = contractKey(state.doc);
    if (key === 'structure') {
      const strikes = Array.isArray(state.doc.structure?.strikes) ? state.doc.structure.strikes : [];
      const names = strikeNames[strikes.length] ?? strikes.map((_, i) => `Strike ${i + 1}`);
      byId('structure-strikes').replaceChildren(
        ...strikes.map((_, i) => field(names[i], bound(`structure.strikes[${i}]`, 'strike'))),
      );
    } else byId('structure-strikes').replaceChildren();
    if (key === 'legs') renderLegs();
    else byId('leg-rows').replaceChildren();
  }

  function renderLegs() {
    const legs = Array.isArray(state.doc.legs) ? state.doc.legs : [];
    byId('leg-rows').replaceChildren(
      ...legs.map((leg, i) => {
        const base = `legs[${i}]`;
        const cells = [
          field(`Leg ${i + 1}`, select(`${base}.type`, legTypes)),
          field('Quantity', bound(`${base}.quantity`, 'number')),
        ];
        if (leg && leg.type !== 'stock') {
          cells.push(
            field('Strike', bound(`${base}.strike`, 'strike')),
            field('Expiry', whenInput(base, 'expiry_date,expiry_years', whenHint)),
            field('Exercise', select({ role: 'exercise', base }, exerciseStyles)),
          );
        }
        return make('div', { className: 'row list-row leg-row' }, [
          ...cells,
          removeButton(
            `Remove leg ${i + 1}`,
            removeRow(() => state.doc.legs.splice(i, 1)),
          ),
        ]);
      }),
    );
  }

  /**
   * A choice that reshapes the form (an option or leg type, an exercise style) was
   * written: a leg turning into a share drops its option fields, a digital gains its
   * payout field, a Bermudan its dates.
   */
  function reshaped(input) {
    const path = input.dataset.path ?? '';
    const leg = /^legs\[(\d+)\]\.type$/.exec(path);
    if (leg && input.value === 'stock')
      state.doc.legs[Number(leg[1])] = { type: 'stock', quantity: state.doc.legs[Number(leg[1])].quantity };
    if (path === 'option.type' && !input.value.startsWith('digital')) delete state.doc.option.payout;
    if (leg) renderLegs();
    for (const node of form.querySelectorAll('[data-path], [data-role]')) {
      // leg rows, and the Bermudan dates a change of exercise style may have filled in
      if (node !== input && (node.closest('.leg-row') || node.dataset.role === 'exercise-dates'))
        fillInput(state.doc, node);
    }
    updateVisibility();
  }

  /** The form's own buttons: the shape, Add dividend, Add leg. */
  function wire() {
    byId('shape').addEventListener('change', (event) => {
      changeShape(state.doc, event.target.value, state.price?.legs);
      refill();
      changed(0);
    });
    byId('add-dividend').addEventListener('click', () => {
      state.doc.market ??= {};
      state.doc.market.dividends ??= [];
      const when = state.doc.valuation_date ? addYears(state.doc.valuation_date, 0.25) : null;
      state.doc.market.dividends.push(when ? { date: when, amount: 0 } : { time_years: 0.25, amount: 0 });
      refill();
      changed();
      byId('dividend-rows').lastElementChild?.querySelector('input')?.focus();
    });
    byId('add-leg').addEventListener('click', () => {
      state.doc.legs ??= [];
      const spot = typeof state.doc.market?.spot === 'number' ? state.doc.market.spot : 100;
      state.doc.legs.push({ type: 'call', strike: spot, ...contractExpiry(state.doc), quantity: 1 });
      refill();
      changed();
    });
  }

  return { fill, reshaped, switchExpiry, updateMarginField, wire };
}
