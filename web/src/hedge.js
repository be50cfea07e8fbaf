// Hedgeleaf page: the hedge schedule along a path the client picks.
// Shown once the engine has the `hedge` command (see core/hedge.hpp).

/** The hedge card: controls, tree, chart and schedule table. */
export function hedgePanel({ state }) {
  const card = document.getElementById('hedge-card');
  return {
    setup() {
      card.hidden = !state.commands.includes('hedge');
    },
    update() {},
  };
}
