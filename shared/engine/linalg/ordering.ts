/**
 * Minimum degree ordering (Tinney & Walker 1967; George & Liu, "The evolution of the minimum
 * degree ordering algorithm", SIAM Review 1989) on the elimination graph kept as bitsets, so
 * that the dense symmetric factor of a sparse room creates little fill. Once the remaining
 * graph is a clique the rest is taken in input order. O(n^2 + fill * n / 32).
 */
export function minimumDegreeOrder(n: number, neighbours: (i: number, visit: (j: number) => void) => void): Int32Array {
  const words = (n + 31) >>> 5;
  const adj = new Uint32Array(n * words);
  for (let i = 0; i < n; i++) {
    neighbours(i, (j) => {
      if (j === i) return;
      adj[i * words + (j >>> 5)] |= 1 << (j & 31);
      adj[j * words + (i >>> 5)] |= 1 << (i & 31);
    });
  }
  const deg = new Int32Array(n);
  const popRow = (i: number) => {
    let c = 0;
    for (let w = i * words, e = w + words; w < e; w++) {
      let x = adj[w];
      x -= (x >>> 1) & 0x55555555;
      x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
      c += (((x + (x >>> 4)) & 0x0f0f0f0f) * 0x01010101) >>> 24;
    }
    return c;
  };
  for (let i = 0; i < n; i++) deg[i] = popRow(i);
  const done = new Uint8Array(n);
  const order = new Int32Array(n);
  const nbr = new Int32Array(n);
  for (let step = 0; step < n; step++) {
    let v = -1;
    for (let i = 0; i < n; i++) if (!done[i] && (v < 0 || deg[i] < deg[v])) v = i;
    const remaining = n - step;
    if (deg[v] >= remaining - 1) {
      // The rest is a clique: any order gives the same fill.
      for (let i = 0; i < n; i++) if (!done[i]) order[step++] = i;
      break;
    }
    order[step] = v;
    done[v] = 1;
    let cnt = 0;
    const rv = v * words;
    for (let w = 0; w < words; w++) {
      let x = adj[rv + w];
      while (x !== 0) {
        const b = 31 - Math.clz32(x & -x);
        nbr[cnt++] = (w << 5) + b;
        x &= x - 1;
      }
    }
    const vw = v >>> 5;
    const vb = ~(1 << (v & 31));
    for (let q = 0; q < cnt; q++) {
      const u = nbr[q];
      const ru = u * words;
      for (let w = 0; w < words; w++) adj[ru + w] |= adj[rv + w];
      adj[ru + (u >>> 5)] &= ~(1 << (u & 31));
      adj[ru + vw] &= vb;
      deg[u] = popRow(u);
    }
  }
  return order;
}
