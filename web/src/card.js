// Hedgeleaf page: what the cards below the terms (hedge, simulation, scenarios,
// solve) share.
//
// A card named "x" is the element #x-card with its settings in #x-controls and
// its figures in #x-output, and it shows only when the engine has the command
// "x". Its controls are rebuilt whenever what they offer changes; the trade
// document fills them, and every bound input gets its error line.
import { byId } from './dom.js';
import { fillInput } from './form.js';

/** The elements of card `name` and whether the engine offers its command. */
export function cardParts(name, state) {
  return {
    card: byId(`${name}-card`),
    controls: byId(`${name}-controls`),
    output: byId(`${name}-output`),
    has: () => state.commands.includes(name),
  };
}

/** Put freshly built controls in place, show the document's values in them and give them error lines. */
export function showControls(controls, parts, doc, bindControls) {
  controls.replaceChildren(...parts);
  for (const input of controls.querySelectorAll('[data-path], [data-role]')) fillInput(doc, input);
  bindControls(controls);
}

/** setup() hides a card the engine cannot fill and draws its controls; render() redraws them. */
export function cardBasics({ card, has }, render) {
  return {
    setup() {
      card.hidden = !has();
      render();
    },
    render,
  };
}
