/** The `need` best of `ids` in order, via a bounded max-heap: O(n log need). */
export function selectTop<T>(ids: Iterable<T>, need: number, better: (x: T, y: T) => boolean): T[] {
  if (need <= 0) return [];
  const heap: T[] = [];
  const worse = (x: T, y: T) => better(y, x);
  const up = (i: number) => {
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (!worse(heap[i], heap[p])) break;
      [heap[i], heap[p]] = [heap[p], heap[i]];
      i = p;
    }
  };
  const down = (i: number) => {
    for (;;) {
      const l = 2 * i + 1;
      const r = l + 1;
      let m = i;
      if (l < heap.length && worse(heap[l], heap[m])) m = l;
      if (r < heap.length && worse(heap[r], heap[m])) m = r;
      if (m === i) return;
      [heap[i], heap[m]] = [heap[m], heap[i]];
      i = m;
    }
  };
  for (const id of ids) {
    if (heap.length < need) {
      heap.push(id);
      up(heap.length - 1);
    } else if (better(id, heap[0])) {
      heap[0] = id;
      down(0);
    }
  }
  return heap.sort((x, y) => (better(x, y) ? -1 : better(y, x) ? 1 : 0));
}
