import type { Graph } from './graph';

/**
 * Reverse Cuthill–McKee ordering of every connected component, each started from a
 * pseudo-peripheral vertex found by the George–Liu algorithm (George & Liu, "Computer Solution
 * of Large Sparse Positive Definite Systems", Prentice-Hall 1981, §4.3.2 and §4.4.2).
 * Components are taken in order of their lowest vertex; neighbours are visited by increasing
 * degree, ties by index (deterministic).
 * @returns perm of length g.n: perm[k] = vertex eliminated k-th.
 */
export function rcmGraph(g: Graph): Int32Array {
  const { n, xadj, adjncy } = g;
  const perm = new Int32Array(n);
  const visited = new Uint8Array(n);
  const levelMark = new Int32Array(n).fill(-1);
  const queue = new Int32Array(n);
  const deg = new Int32Array(n);
  for (let v = 0; v < n; v++) deg[v] = xadj[v + 1] - xadj[v];
  let stamp = 0;
  let pos = 0;

  // Breadth-first level structure rooted at r within the unvisited component; returns the
  // number of levels, leaves the vertices in queue[0..size) and the last level's start in out.
  const out = { size: 0, lastStart: 0 };
  const levels = (r: number): number => {
    stamp++;
    let head = 0;
    let tail = 0;
    queue[tail++] = r;
    levelMark[r] = stamp;
    let nlev = 0;
    let lastStart = 0;
    while (head < tail) {
      lastStart = head;
      const end = tail;
      nlev++;
      for (; head < end; head++) {
        const v = queue[head];
        for (let p = xadj[v]; p < xadj[v + 1]; p++) {
          const u = adjncy[p];
          if (!visited[u] && levelMark[u] !== stamp) {
            levelMark[u] = stamp;
            queue[tail++] = u;
          }
        }
      }
    }
    out.size = tail;
    out.lastStart = lastStart;
    return nlev;
  };

  for (let s = 0; s < n; s++) {
    if (visited[s]) continue;
    // --- Pseudo-peripheral start vertex (George–Liu): from a minimum-degree vertex of the
    // component, move to a minimum-degree vertex of the last level while eccentricity grows.
    levels(s);
    let r = s;
    for (let t = 0; t < out.size; t++) {
      const v = queue[t];
      if (deg[v] < deg[r] || (deg[v] === deg[r] && v < r)) r = v;
    }
    let ecc = levels(r);
    for (;;) {
      let best = -1;
      for (let t = out.lastStart; t < out.size; t++) {
        const v = queue[t];
        if (best === -1 || deg[v] < deg[best] || (deg[v] === deg[best] && v < best)) best = v;
      }
      const e2 = levels(best);
      if (e2 <= ecc) break;
      ecc = e2;
      r = best;
    }
    // --- Cuthill–McKee from r, neighbours by increasing degree -----------------------------
    const first = pos;
    perm[pos++] = r;
    visited[r] = 1;
    for (let head = first; head < pos; head++) {
      const v = perm[head];
      const from = pos;
      for (let p = xadj[v]; p < xadj[v + 1]; p++) {
        const u = adjncy[p];
        if (!visited[u]) {
          visited[u] = 1;
          perm[pos++] = u;
        }
      }
      // insertion sort of the new vertices by (degree, index): lists are short
      for (let a = from + 1; a < pos; a++) {
        const u = perm[a];
        let b = a - 1;
        while (b >= from && (deg[perm[b]] > deg[u] || (deg[perm[b]] === deg[u] && perm[b] > u))) {
          perm[b + 1] = perm[b];
          b--;
        }
        perm[b + 1] = u;
      }
    }
    // --- Reverse this component's block -------------------------------------------------------
    for (let a = first, b = pos - 1; a < b; a++, b--) {
      const t = perm[a];
      perm[a] = perm[b];
      perm[b] = t;
    }
  }
  return perm;
}
