"use client";
// Which lesion is selected, held outside React state: a tap tells the store, and only what
// subscribes to the lesions it names is rendered again (the lesion that lost the selection,
// the one that gained it, the handles). The rest of the map, and the screen around it, are
// left alone, so a tap costs two shapes and not two hundred.
import { useLayoutEffect, useState, useSyncExternalStore } from "react";

export interface SelectionStore {
  get(): string | null;
  set(id: string | null): void;
  subscribe(listener: () => void): () => void;
}

export function createSelectionStore(initial: string | null = null): SelectionStore {
  let current = initial;
  const listeners = new Set<() => void>();
  return {
    get: () => current,
    set(id) {
      if (id === current) return;
      current = id;
      for (const l of [...listeners]) l();
    },
    subscribe(listener) {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
  };
}

/** True while `id` is the selected lesion; re-renders only when that answer changes. */
export function useIsSelected(store: SelectionStore, id: string): boolean {
  return useSyncExternalStore(store.subscribe, () => store.get() === id, () => store.get() === id);
}

/** The selected id; re-renders on every change of selection. */
export function useSelectedId(store: SelectionStore): string | null {
  return useSyncExternalStore(store.subscribe, store.get, store.get);
}

/** The selected lesion among `lesions` (undefined when none is, or it is not among them). */
export function useSelectedLesion<L extends { id: string }>(store: SelectionStore, lesions: readonly L[]): L | undefined {
  const id = useSelectedId(store);
  return id ? lesions.find((l) => l.id === id) : undefined;
}

/** A store that follows a `selectedId` prop, for maps whose owner keeps selection in React state. */
export function useSelectionFromProp(selectedId: string | null | undefined): SelectionStore {
  const [store] = useState(() => createSelectionStore(selectedId ?? null));
  useLayoutEffect(() => store.set(selectedId ?? null), [store, selectedId]);
  return store;
}
