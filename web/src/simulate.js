// Hedgeleaf page: the discrete-hedging simulation on its own Web Worker.
// Shown once the engine has the `simulate` command (see core/simulate.hpp).

/** The simulation card: settings, run, progress, cancel, results. */
export function simulatePanel({ state }) {
  const card = document.getElementById('simulate-card');
  return {
    setup() {
      card.hidden = !state.commands.includes('simulate');
    },
    update() {},
  };
}
