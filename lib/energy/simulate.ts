/**
 * Hour-by-hour energy store: each hour adds what the cell harvested and takes
 * what the device spent. The store cannot hold more than its usable energy
 * (½·C·(V₁² − V₂²)); when it would fall below empty the device browns out that
 * hour (it goes silent until light returns), and the store stays at empty.
 */
export type StoreRun = { storedUj: Float64Array; brownoutHours: number[]; endUj: number };

export function simulateStore(harvestUj: ArrayLike<number>, spendPerHourUj: number, capacityUj: number, startUj: number): StoreRun {
  const n = harvestUj.length;
  const storedUj = new Float64Array(n);
  const brownoutHours: number[] = [];
  let e = Math.min(Math.max(startUj, 0), capacityUj);
  for (let h = 0; h < n; h++) {
    e += harvestUj[h] - spendPerHourUj;
    if (e < 0) {
      brownoutHours.push(h);
      e = 0;
    } else if (e > capacityUj) e = capacityUj;
    storedUj[h] = e;
  }
  return { storedUj, brownoutHours, endUj: e };
}

// Enough repeats for a store that drains or fills over a season; the run stops as soon as a week repeats itself.
const MAX_WEEKS = 60;

/**
 * The same week repeated until it settles: start full and run weeks until the
 * store ends a week where it began (within a millionth of its size). The last
 * week is what a device lives with, week after week.
 */
export function steadyWeek(harvestUj: ArrayLike<number>, spendPerHourUj: number, capacityUj: number): StoreRun & { weeks: number } {
  let start = capacityUj;
  let weeks = 1;
  // Find the settled start without keeping the hours, then run the last week once in full.
  for (; weeks < MAX_WEEKS; weeks++) {
    const end = storeEnd(harvestUj, spendPerHourUj, capacityUj, start);
    if (Math.abs(end - start) <= capacityUj * 1e-6) break;
    start = end;
  }
  return { ...simulateStore(harvestUj, spendPerHourUj, capacityUj, start), weeks };
}

/** simulateStore's end value alone, with nothing allocated. */
function storeEnd(harvestUj: ArrayLike<number>, spendPerHourUj: number, capacityUj: number, startUj: number): number {
  let e = Math.min(Math.max(startUj, 0), capacityUj);
  for (let h = 0; h < harvestUj.length; h++) {
    e += harvestUj[h] - spendPerHourUj;
    if (e < 0) e = 0;
    else if (e > capacityUj) e = capacityUj;
  }
  return e;
}
