/** The state one exchange round works on; `owner` and `loads` are updated in place, `weights` too. */
export interface ExchangeState {
  sites: Float64Array;
  weights: Float64Array;
  points: Float64Array;
  mass: Float64Array;
  targets: Float64Array;
  owner: Int32Array;
  loads: Float64Array;
  /** Sites that can take over points of `site`'s cell, or give it theirs: its neighbours and the hidden sites. */
  competitors(site: number): ArrayLike<number>;
  /** Added past the last margin when a site hands over all the points it can: far below any distance that matters. */
  nudge: number;
}

/**
 * One round of exact coordinate moves on the piecewise linear concave
 * function of the demand mode: sites in order of decreasing |load - target|
 * each change their own weight, others fixed, to the value that brings the
 * load closest to the target. An overloaded site lowers its weight just
 * past the margins of its points nearest to leaving (margin = power
 * distance to the best rival minus to itself); an underloaded one raises it
 * just past the margins of its rivals' points nearest to coming over. Points
 * at exactly equal margins move together; the new weight sits halfway
 * between the last margin taken and the next, so floating error in the
 * margins does not decide who moves. Returns how many sites moved.
 * The owners are floating estimates; callers recount them from the exact diagram.
 */
export function exchangeRound(s: ExchangeState, margin: Float64Array, rival: Int32Array): number {
  const { sites, weights, points, mass, targets, owner, loads } = s;
  const n = targets.length, count = mass.length;
  // The points of each cell at the start of the round, as ranges of one index array.
  const start = new Int32Array(n + 1);
  for (let k = 0; k < count; k++) start[owner[k] + 1]++;
  for (let i = 0; i < n; i++) start[i + 1] += start[i];
  const members = new Int32Array(count), fill = start.slice(0, n);
  for (let k = 0; k < count; k++) members[fill[owner[k]]++] = k;
  const order = Array.from({ length: n }, (_, i) => i)
    .filter((i) => loads[i] !== targets[i])
    .sort((a, b) => Math.abs(loads[b] - targets[b]) - Math.abs(loads[a] - targets[a]) || a - b);
  const cost = (k: number, j: number) =>
    (points[2 * k] - sites[2 * j]) ** 2 + (points[2 * k + 1] - sites[2 * j + 1]) ** 2 - weights[j];
  let moved = 0;
  const list: number[] = [];
  for (const i of order) {
    const cand = s.competitors(i);
    const shed = loads[i] > targets[i];
    list.length = 0;
    if (shed) {
      for (let r = start[i]; r < start[i + 1]; r++) {
        const k = members[r];
        if (owner[k] !== i) continue;
        let best = Infinity, bestSite = -1;
        for (let c = 0; c < cand.length; c++) {
          const d = cost(k, cand[c]);
          if (d < best) { best = d; bestSite = cand[c]; }
        }
        if (bestSite < 0) continue;
        margin[k] = Math.max(0, best - cost(k, i));
        rival[k] = bestSite;
        list.push(k);
      }
    } else {
      for (let c = 0; c < cand.length; c++) {
        for (let r = start[cand[c]]; r < start[cand[c] + 1]; r++) {
          const k = members[r];
          if (owner[k] === i) continue;
          margin[k] = Math.max(0, cost(k, i) - cost(k, owner[k]));
          rival[k] = i;
          list.push(k);
        }
      }
    }
    list.sort((a, b) => margin[a] - margin[b]);
    let load = loads[i], cut = 0, bestGap = Math.abs(load - targets[i]);
    for (let r = 0; r < list.length;) {
      let e = r;
      while (e < list.length && margin[list[e]] === margin[list[r]]) load += shed ? -mass[list[e++]] : mass[list[e++]];
      const gap = Math.abs(load - targets[i]);
      if (gap < bestGap) { bestGap = gap; cut = e; }
      if (shed ? load < targets[i] : load > targets[i]) break;
      r = e;
    }
    if (cut === 0) continue;
    const last = margin[list[cut - 1]];
    const next = cut < list.length ? margin[list[cut]] : 2 * last + s.nudge;
    weights[i] += (shed ? -0.5 : 0.5) * (last + next);
    for (let r = 0; r < cut; r++) {
      const k = list[r], from = owner[k];
      owner[k] = rival[k];
      loads[from] -= mass[k];
      loads[rival[k]] += mass[k];
    }
    moved++;
  }
  return moved;
}
