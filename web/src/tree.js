// Hedgeleaf page: the small lattice the hedge card draws for a path of
// "steps on a tree" (the `tree` command's nodes), with the path marked on it.
// Picking a node routes the path through it, changing as few steps as possible.
import { make, makeSvg } from './dom.js';
import { formatNumber } from './format.js';

/** Moves that reach node (step, index) keeping as much of `moves` as possible. */
export function routeThrough(moves, step, index) {
  const list = [...moves];
  let ups = list.slice(0, step).filter((m) => m === 'U').length;
  for (let i = step - 1; i >= 0 && ups !== index; i -= 1) {
    if (ups > index && list[i] === 'U') {
      list[i] = 'D';
      ups -= 1;
    } else if (ups < index && list[i] === 'D') {
      list[i] = 'U';
      ups += 1;
    }
  }
  return list.join('');
}

/** The nodes "step:index" the path `moves` ("UDDU...") passes through. */
function pathNodes(moves) {
  const onPath = new Set(['0:0']);
  let j = 0;
  [...moves].forEach((m, n) => {
    if (m === 'U') j += 1;
    onPath.add(`${n + 1}:${j}`);
  });
  return onPath;
}

/**
 * Draw `tree` (a `tree` result) into `host` with the path `moves` marked, spots with `digits`
 * decimals; picking a node after the first calls `pick(moves)` with the path routed through it.
 */
export function drawTree(host, tree, moves, pick, digits = 2) {
  const nodes = tree.nodes;
  const steps = tree.to_step;
  const onPath = pathNodes(moves);
  const dx = 92;
  const dy = 24;
  const width = 60 + steps * dx + 50;
  const height = 40 + steps * 2 * dy;
  const x = (n) => 40 + n * dx;
  const y = (n, i) => height / 2 - (2 * i - n) * dy;
  const root = makeSvg('svg', {
    viewBox: `0 0 ${width} ${height}`,
    class: 'tree-svg',
    role: 'group',
    'aria-label': 'Lattice of spot; pick a node to route the path through it',
  });
  for (const node of nodes) {
    if (node.step >= steps) continue;
    for (const k of [0, 1]) {
      const on = onPath.has(`${node.step}:${node.index}`) && onPath.has(`${node.step + 1}:${node.index + k}`);
      root.append(
        makeSvg('line', {
          x1: x(node.step),
          y1: y(node.step, node.index),
          x2: x(node.step + 1),
          y2: y(node.step + 1, node.index + k),
          class: `edge${on ? ' on-path' : ''}`,
        }),
      );
    }
  }
  for (const node of nodes) {
    const on = onPath.has(`${node.step}:${node.index}`);
    const g = makeSvg('g', {
      class: `node${on ? ' on-path' : ''}${node.event === 'early' ? ' exercise' : ''}`,
      tabindex: -1,
      role: 'button',
      // the name holds the text the node shows, its spot, as it reads
      'aria-label': `Step ${node.step}: spot ${formatNumber(node.spot, digits)}, value ${formatNumber(node.value, 2)}${node.event === 'early' ? ', exercised early' : ''}`,
    });
    g.append(makeSvg('circle', { cx: x(node.step), cy: y(node.step, node.index), r: 6 }));
    g.append(
      makeSvg(
        'text',
        { x: x(node.step), y: y(node.step, node.index) - 9, 'text-anchor': 'middle' },
        formatNumber(node.spot, digits),
      ),
    );
    if (node.step > 0) {
      const choose = () => pick(routeThrough(moves, node.step, node.index));
      g.addEventListener('click', choose);
      g.addEventListener('keydown', (event) => {
        if (event.key === 'Enter' || event.key === ' ') {
          event.preventDefault();
          choose();
        }
      });
    }
    root.append(g);
    // beside the node, not in it: a button's name must hold the text it shows (its spot)
    if (on)
      root.append(
        makeSvg(
          'text',
          { x: x(node.step), y: y(node.step, node.index) + 17, 'text-anchor': 'middle', class: 'node-value' },
          `V ${formatNumber(node.value, 2)}`,
        ),
      );
  }
  host.replaceChildren(root, legend(tree));
}

/** What the tree shows, with the step's up and down factors and the hedge at a node. */
function legend(tree) {
  // the forward growth of one step under the pricing probabilities: p u + (1 - p) d
  const growth = tree.p_up * tree.up + (1 - tree.p_up) * tree.down;
  // a pair's nodes hold foreign currency where a share's hold shares (docs/currency.md)
  const held = tree.nodes?.[0]?.[0]?.foreign !== undefined ? 'in foreign currency' : 'shares';
  return make('p', {
    className: 'hint',
    text:
      `Spot above each node, the trade's value (V) on the path. ` +
      `Per ${formatNumber(tree.dt_years * 365, 1)} days: up ×${formatNumber(tree.up, 4)}, down ×${formatNumber(tree.down, 4)}, ` +
      `forward growth ×${formatNumber(growth, 4)} (down < growth < up: no arbitrage), up-probability ${formatNumber(tree.p_up, 4)}. ` +
      `At each node the hedge holds Δ = (V up − V down) / (S up − S down) ${held} and B = V − Δ·S in cash. ` +
      'Ringed nodes: the holder exercises early.',
  });
}
