import "server-only";
// Research figures that take seconds to work out at registry scale (the study dashboard, the clinic
// quality panel) are stored with the time they were worked out and served from the store. A load
// that finds a key with no figures works it out before answering; a load that finds figures older
// than the store's age serves them and starts a refresh behind them. So a change shows within that
// age plus one refresh, and the page says how old its figures are.

export interface Stored<F> {
  key: string;
  computedAt: Date;
  figures: F;
}

export interface FigureStore<F> {
  /** Stored figures of these keys (absent keys are simply missing). */
  read(keys: string[]): Promise<Stored<F>[]>;
  compute(key: string): Promise<F>;
  /** Must keep the newer figures when two refreshes race (compare computedAt). */
  save(key: string, computedAt: Date, figures: F): Promise<void>;
  maxAgeSeconds(): number;
}

export interface Loaded<F> {
  items: Stored<F>[];
  /** The oldest of the items' times: every figure shown is at least this recent. */
  asOf: Date;
  /** This load started a background refresh of stale figures. */
  refreshing: boolean;
}

// One refresh per key at a time in this process; a second load joins the first.
const inFlight = new Map<string, Promise<void>>();

export function storedFigures<F>(name: string, store: FigureStore<F>) {
  const refreshOne = (key: string): Promise<void> => {
    const id = `${name}:${key}`;
    const running = inFlight.get(id);
    if (running) return running;
    const started = new Date(); // the figures describe the records as of the start of the reads
    const p = store
      .compute(key)
      .then((f) => store.save(key, started, f))
      .finally(() => inFlight.delete(id));
    inFlight.set(id, p);
    return p;
  };
  return {
    /** Works the figures out again now (what a stale load starts; scripts and tests call it too). */
    async refresh(keys: string[]): Promise<void> {
      await Promise.all(keys.map(refreshOne));
    },
    async load(keys: string[], now = new Date()): Promise<Loaded<F>> {
      let items = await store.read(keys);
      const missing = keys.filter((k) => !items.some((s) => s.key === k));
      if (missing.length) {
        await Promise.all(missing.map(refreshOne));
        items = await store.read(keys);
      }
      const stale = items.filter((s) => now.getTime() - s.computedAt.getTime() > store.maxAgeSeconds() * 1000);
      for (const s of stale) refreshOne(s.key).catch((err: Error) => console.error(`[${name}] refresh failed:`, err.message));
      const asOf = items.reduce((t, s) => (s.computedAt < t ? s.computedAt : t), now);
      return { items, asOf, refreshing: stale.length > 0 };
    },
  };
}

/** Waits for refreshes started in the background (tests and scripts, before they close the pool). */
export async function settleStoredFigures(): Promise<void> {
  await Promise.allSettled([...inFlight.values()]);
}
