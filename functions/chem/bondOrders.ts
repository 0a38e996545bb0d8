// Bond orders and formal charges for a known connectivity (bonds perceived from coordinates): every
// atom must reach one of its usual valences — the sum of its bond orders — for its formal charge.
// The valence table is the standard one of organic and main-group chemistry (common practice):
// carbon 4; nitrogen 3 (4 as N⁺, 2 as N⁻); oxygen 2 (1 as O⁻, 3 as O⁺); sulfur 2, 4 or 6; …
//
// The search: each atom above its neighbour count needs "extra" bond order (a double bond gives each
// end one, a triple two). A depth-first search visits atoms in breadth-first order, chooses each
// atom's valence state and spreads its missing order over bonds to atoms not yet visited, checking
// ahead that no unvisited neighbour is over-filled or cut off from what it still needs. That is a
// b-matching over the unsaturated atoms, so an aromatic ring comes out as one Kekulé structure.
// Neutral assignments are searched first, then ones with charged atoms in order of rising cost (see
// the table), so charges are used only when the structure needs them (nitro groups, N-oxides,
// zwitterions), and always summing to the given net charge. When nothing fits — radicals, metals, unusual valences, a wrong net
// charge — the caller gets the reason instead of invented bonds.

/**
 * Usual [valence, formal charge, cost] states per element, the preferred first (common practice). A
 * charge costs 1 on N, O⁻, S, halide and the like; O⁺ costs 2 and a carbon ion 3, so among
 * resonance forms the one with the charge on the electronegative atom is found first (phenoxide as
 * O⁻, not a ring carbanion; pyrylium as O⁺).
 */
const VALENCE_STATES: Record<string, readonly (readonly [number, number, number?])[]> = {
  H: [[1, 0]],
  B: [[3, 0], [4, -1]],
  Al: [[3, 0], [4, -1]],
  Ga: [[3, 0], [4, -1]],
  In: [[3, 0], [4, -1]],
  C: [[4, 0], [3, -1, 3], [3, 1, 3]],
  Si: [[4, 0]],
  Ge: [[4, 0]],
  Sn: [[4, 0]],
  N: [[3, 0], [4, 1], [2, -1]],
  P: [[3, 0], [5, 0], [4, 1]],
  As: [[3, 0], [5, 0], [4, 1]],
  Sb: [[3, 0], [5, 0], [4, 1]],
  O: [[2, 0], [1, -1], [3, 1, 2]],
  S: [[2, 0], [4, 0], [6, 0], [1, -1], [3, 1]],
  Se: [[2, 0], [4, 0], [6, 0], [1, -1], [3, 1]],
  Te: [[2, 0], [4, 0], [6, 0], [1, -1], [3, 1]],
  F: [[1, 0], [0, -1]],
  Cl: [[1, 0], [3, 0], [5, 0], [7, 0], [0, -1]],
  Br: [[1, 0], [3, 0], [5, 0], [7, 0], [0, -1]],
  I: [[1, 0], [3, 0], [5, 0], [7, 0], [0, -1]],
  He: [[0, 0]],
  Ne: [[0, 0]],
  Ar: [[0, 0]],
  Kr: [[0, 0], [2, 0]],
  Xe: [[0, 0], [2, 0], [4, 0], [6, 0]],
};

/** Most total charge cost tried before giving up (a zwitterion or a nitro group costs 2, CO 5). */
const maxChargeCost = 12;
/** Search steps allowed per structure, so a large structure with no answer cannot hold the import. */
const stepLimit = 200_000;

export type BondOrderResult = { orders: (1 | 2 | 3)[]; charges: number[] } | { problem: string };

class SearchTooLong extends Error {}

/** Bond orders (one per bond) and formal charges (one per atom) for the given bonds, or why none fit. */
export function assignBondOrders(elements: readonly string[], bonds: readonly (readonly [number, number])[], totalCharge: number): BondOrderResult {
  const n = elements.length;
  const neighbours: { atom: number; bond: number }[][] = elements.map(() => []);
  bonds.forEach(([a, b], bond) => {
    neighbours[a].push({ atom: b, bond });
    neighbours[b].push({ atom: a, bond });
  });
  const degree = neighbours.map((list) => list.length);
  const states: (readonly (readonly [number, number, number?])[])[] = [];
  for (let i = 0; i < n; i++) {
    const table = VALENCE_STATES[elements[i]];
    if (!table) return { problem: `atom ${i + 1} (${elements[i]}): no valence rule for ${elements[i]} (metals and other unusual valences are outside this heuristic)` };
    // A state fits when the atom's neighbours leave it at most two extra orders per bond to fill.
    const fitting = table.filter(([valence]) => valence >= degree[i] && valence - degree[i] <= 2 * degree[i]);
    if (fitting.length === 0)
      return { problem: `atom ${i + 1} (${elements[i]}) with ${degree[i]} bonded neighbour${degree[i] === 1 ? '' : 's'} fits none of its valences (a radical, an ion without its charge, or a wrong geometry?)` };
    states.push(fitting);
  }
  // Every state in the table has valence + charge of one parity per element (the parity of its
  // valence electrons), so an odd total over the structure is an odd electron count: a radical or
  // a wrong net charge, which no bond orders can close.
  const electronParity = states.reduce((sum, list, i) => sum + list[0][0] - degree[i] + list[0][1], totalCharge);
  if (electronParity % 2 !== 0) {
    const net = totalCharge === 0 ? 'neutral' : `net charge ${totalCharge > 0 ? '+' : ''}${totalCharge}`;
    return { problem: `an odd number of electrons (${net}): a radical, or the net charge is missing or wrong, so no closed-shell bond orders exist` };
  }
  const mostExtra = states.map((list, i) => Math.max(...list.map(([v]) => v - degree[i])));
  const leastExtra = states.map((list, i) => Math.min(...list.map(([v]) => v - degree[i])));

  // Breadth-first order keeps each atom's neighbours close behind it, so dead ends show early.
  const order: number[] = [];
  const position = new Array<number>(n).fill(-1);
  for (let start = 0; start < n; start++) {
    if (position[start] >= 0) continue;
    position[start] = order.length;
    order.push(start);
    for (let k = order.length - 1; k < order.length; k++)
      for (const { atom } of neighbours[order[k]])
        if (position[atom] < 0) {
          position[atom] = order.length;
          order.push(atom);
        }
  }
  const later = order.map((i) => neighbours[i].filter(({ atom }) => position[atom] > position[i]));

  // Parity: a bond's extra order counts at both its ends, so over one connected piece the atoms'
  // extras (valence − neighbours) sum to an even number. An element's neutral valences share one
  // parity and a charge flips it, so once the budget left cannot pay for a flip, an odd sum over the
  // atoms still to visit ends the branch at once (a radical is refused without trying every Kekulé
  // structure). By position in `order`: the parity of the rest of the piece in each atom's cheapest
  // state, and the cheapest state of the other parity there.
  const costOf = ([, charge, cost]: readonly [number, number, number?]) => cost ?? (charge === 0 ? 0 : 1);
  const startsPiece = order.map((_, k) => k === 0 || !neighbours[order[k]].some(({ atom }) => position[atom] < k));
  const restParity = new Array<number>(n + 1).fill(0);
  const restFlipCost = new Array<number>(n + 1).fill(Infinity);
  for (let k = n - 1; k >= 0; k--) {
    const i = order[k];
    const cheapest = states[i].reduce((best, st) => (costOf(st) < costOf(best) ? st : best));
    const parity = (cheapest[0] - degree[i]) & 1;
    const flip = Math.min(...states[i].filter(([v]) => ((v - degree[i]) & 1) !== parity).map(costOf));
    const continues = k + 1 < n && !startsPiece[k + 1];
    restParity[k] = parity ^ (continues ? restParity[k + 1] : 0);
    restFlipCost[k] = Math.min(flip, continues ? restFlipCost[k + 1] : Infinity);
  }

  const extra = new Array<number>(bonds.length).fill(0);
  const received = new Array<number>(n).fill(0);
  const unvisited = degree.slice();
  const charges = new Array<number>(n).fill(0);
  let steps = 0;
  let budget = 0;

  // An unvisited atom must still be able to reach some valence: not over-filled, and its open bonds
  // able to carry what its least demanding state still needs.
  const stillPossible = (j: number) => received[j] <= mostExtra[j] && Math.max(0, leastExtra[j] - received[j]) <= 2 * unvisited[j];

  // `parity`: of the extras chosen so far in the current connected piece.
  const visit = (k: number, cost: number, chargeSum: number, parity: number): boolean => {
    if (++steps > stepLimit) throw new SearchTooLong();
    if (k === n) return chargeSum === totalCharge;
    // Every unit of charge still missing needs a charged atom, and each costs at least 1.
    if (Math.abs(totalCharge - chargeSum) > budget - cost) return false;
    if (startsPiece[k]) parity = 0;
    if (budget - cost < restFlipCost[k] && (parity ^ restParity[k]) === 1) return false;
    const i = order[k];
    for (const { atom } of neighbours[i]) unvisited[atom]--;
    for (const state of states[i]) {
      const [valence, charge] = state;
      const nowCost = cost + costOf(state);
      const need = valence - degree[i] - received[i];
      if (nowCost > budget || need < 0 || need > 2 * later[k].length) continue;
      charges[i] = charge;
      const nowParity = parity ^ ((valence - degree[i]) & 1);
      if (spread(k, 0, need, () => visit(k + 1, nowCost, chargeSum + charge, nowParity))) return true;
    }
    charges[i] = 0;
    for (const { atom } of neighbours[i]) unvisited[atom]++;
    return false;
  };

  // Spreads `need` extra orders over atom order[k]'s bonds to unvisited atoms, from index `from` on.
  const spread = (k: number, from: number, need: number, next: () => boolean): boolean => {
    const open = later[k];
    if (from === open.length) return need === 0 && open.every(({ atom }) => stillPossible(atom)) && next();
    if (need > 2 * (open.length - from)) return false;
    const { atom, bond } = open[from];
    for (let x = Math.min(2, need, mostExtra[atom] - received[atom]); x >= 0; x--) {
      extra[bond] = x;
      received[atom] += x;
      if (spread(k, from + 1, need - x, next)) return true;
      received[atom] -= x;
      extra[bond] = 0;
    }
    return false;
  };

  const chargeable = states.filter((list) => list.some(([, q]) => q !== 0)).length;
  try {
    for (budget = 0; budget <= Math.min(maxChargeCost, 3 * chargeable); budget++) {
      if (visit(0, 0, 0, 0)) return { orders: extra.map((x) => (x + 1) as 1 | 2 | 3), charges: charges.slice() };
    }
  } catch (e) {
    if (!(e instanceof SearchTooLong)) throw e;
    return { problem: `no bond orders found within ${stepLimit.toLocaleString('en')} search steps` };
  }
  const net = totalCharge === 0 ? 'neutral' : `net charge ${totalCharge > 0 ? '+' : ''}${totalCharge}`;
  return { problem: `no bond orders satisfy every atom's valence (${net}, up to ${maxChargeCost} charged heteroatoms tried): a radical, a metal, an unusual valence or a missing charge` };
}
