"use client";
// Lesions of one visit: the server's truth (SWR) plus a local overlay of changes not yet
// confirmed. A change shows at once and is saved in the background, one request at a time
// per lesion; a failed save stays on screen with a retry, a conflict reloads and says so.
import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import useSWR from "swr";
import { ApiError, fetcher, sendJson } from "@/components/data/fetcher";
import { newClientKey } from "@/lib/ids/client-key";
import type { CreateLesionInput, LesionDto, UpdateLesionInput, VisitMapDto } from "@/lib/validation/lesions";
import { api } from "@/components/data/keys";

export type LesionPatch = Partial<CreateLesionInput>;
export type SaveInfo = { state: "saving" | "failed"; message?: string; retry?: () => void };
export type Notice = { tone: "caution" | "danger"; text: string } | null;

interface Overlay {
  creates: ReadonlyMap<string, LesionDto>;
  edits: ReadonlyMap<string, LesionPatch>;
  deletes: ReadonlySet<string>;
  status: Readonly<Record<string, SaveInfo | undefined>>;
  /** Temporary id → server id, once a create is confirmed (selection follows it). */
  renamed: Readonly<Record<string, string>>;
}
const EMPTY: Overlay = { creates: new Map(), edits: new Map(), deletes: new Set(), status: {}, renamed: {} };

const FIELDS = ["clockStartH", "clockEndH", "distanceStartCm", "distanceEndCm", "grade", "morphology", "acetowhite", "lugol", "vessels", "sizeMm", "note"] as const;
const pickFields = (l: LesionDto): CreateLesionInput => Object.fromEntries(FIELDS.map((k) => [k, l[k]])) as CreateLesionInput;

function describeFailure(err: unknown): string {
  if (err instanceof ApiError) {
    const first = err.fields ? Object.values(err.fields)[0]?.[0] : undefined;
    return first ?? err.message;
  }
  return "Unexpected error.";
}

let tempCounter = 0;

/**
 * `initial`: the map as the server read it for the page, shown at once. It is as fresh as a fetch,
 * so it is not fetched again on mount; it replaces whatever an earlier visit to the page left in
 * SWR's cache, and SWR refreshes it from then on (focus, writes).
 */
export function useLesionStore(visitId: string, initial?: VisitMapDto) {
  const key = api.visitPart(visitId, "lesions");
  const swr = useSWR<VisitMapDto>(key, fetcher, { fallbackData: initial, revalidateOnMount: !initial, revalidateOnFocus: true, keepPreviousData: true });
  const [overlay, setOverlay] = useState<Overlay>(EMPTY);
  const [notice, setNotice] = useState<Notice>(null);
  const ov = useRef(overlay);
  const server = useRef<VisitMapDto | undefined>(swr.data);
  // Only a new object from SWR replaces our copy, so our own later writes are never undone.
  useEffect(() => {
    server.current = swr.data;
  }, [swr.data]);
  // Retries call the latest version of the operations (they are declared below).
  const ops = useRef<Record<"runCreate" | "runEdit" | "remove", (id: string) => void>>({ runCreate: () => {}, runEdit: () => {}, remove: () => {} });
  const queues = useRef(new Map<string, Promise<void>>());
  const alias = useRef(new Map<string, string>()); // temporary id → server id
  const chainOf = useRef(new Map<string, string>()); // server id → temporary id it came from
  // temporary id → the key its create is sent with, every time: a retry after a lost answer
  // gets back the lesion the first attempt made instead of a second copy.
  const clientKeys = useRef(new Map<string, string>());

  const update = useCallback((fn: (o: Overlay) => Overlay) => {
    ov.current = fn(ov.current);
    setOverlay(ov.current);
  }, []);
  const setStatus = useCallback((id: string, info: SaveInfo | undefined) => update((o) => ({ ...o, status: { ...o.status, [id]: info } })), [update]);
  const mutateServer = swr.mutate;
  useEffect(() => {
    if (initial) void mutateServer(initial, { revalidate: false });
  }, [initial, mutateServer]);
  const setServer = useCallback(
    (fn: (d: VisitMapDto) => VisitMapDto) => {
      if (!server.current) return;
      server.current = fn(server.current);
      void mutateServer(server.current, { revalidate: false });
    },
    // The bound mutate is stable; the SWR response object is new on every render, and depending
    // on it would hand every memoised lesion shape new callbacks at every tap.
    [mutateServer],
  );

  /** One request at a time per lesion, in the order the user made the changes. */
  const enqueue = useCallback((id: string, op: () => Promise<void>) => {
    const chain = chainOf.current.get(id) ?? id;
    const next = (queues.current.get(chain) ?? Promise.resolve()).then(op, op);
    queues.current.set(chain, next);
  }, []);

  const onFailure = useCallback(
    (id: string, err: unknown, retry: () => void, verb: string) => {
      if (err instanceof ApiError && (err.status === 409 || err.status === 404)) {
        update((o) => {
          const edits = new Map(o.edits);
          edits.delete(id);
          const deletes = new Set(o.deletes);
          deletes.delete(id);
          return { ...o, edits, deletes, status: { ...o.status, [id]: undefined } };
        });
        setNotice({ tone: "caution", text: "Changed by someone else — reloaded. Check the lesion and make your change again." });
        void mutateServer();
        return;
      }
      if (err instanceof ApiError && err.status === 423) {
        ov.current = EMPTY;
        setOverlay(EMPTY);
        setNotice({ tone: "danger", text: "This visit has been signed, so the map can no longer be changed. Your unsaved change was not kept." });
        void mutateServer();
        return;
      }
      setStatus(id, { state: "failed", message: `Not ${verb}: ${describeFailure(err)}`, retry });
    },
    [update, setStatus, mutateServer],
  );

  const runCreate = useCallback(
    (tempId: string) => {
      enqueue(tempId, async () => {
        const local = ov.current.creates.get(tempId);
        if (!local || alias.current.has(tempId)) return;
        setStatus(tempId, { state: "saving" });
        try {
          let clientKey = clientKeys.current.get(tempId);
          if (!clientKey) clientKeys.current.set(tempId, (clientKey = newClientKey()));
          const { lesion } = await sendJson<{ lesion: LesionDto }>("POST", key, { ...pickFields(local), clientKey });
          alias.current.set(tempId, lesion.id);
          chainOf.current.set(lesion.id, tempId);
          setServer((d) => ({ ...d, lesions: [...d.lesions.filter((l) => l.id !== lesion.id), lesion] }));
          update((o) => {
            const creates = new Map(o.creates);
            const after = creates.get(tempId);
            creates.delete(tempId);
            const edits = new Map(o.edits);
            // Edits made while the create was in flight move to the server id and go out next.
            if (after && after !== local) edits.set(lesion.id, { ...pickFields(after) });
            const moved = edits.get(tempId);
            if (moved) edits.set(lesion.id, { ...edits.get(lesion.id), ...moved });
            edits.delete(tempId);
            const deletes = new Set(o.deletes);
            if (deletes.delete(tempId)) deletes.add(lesion.id);
            return { ...o, creates, edits, deletes, status: { ...o.status, [tempId]: undefined }, renamed: { ...o.renamed, [tempId]: lesion.id } };
          });
        } catch (err) {
          onFailure(tempId, err, () => ops.current.runCreate(tempId), "saved");
        }
      });
    },
    [enqueue, key, setServer, setStatus, update, onFailure],
  );

  const runEdit = useCallback(
    (id: string) => {
      enqueue(id, async () => {
        const realId = alias.current.get(id) ?? id;
        if (ov.current.creates.has(realId)) return; // never created: the create's retry sends it all
        const patch = ov.current.edits.get(realId);
        const base = server.current?.lesions.find((l) => l.id === realId);
        if (!patch || !base) return;
        setStatus(realId, { state: "saving" });
        try {
          const body: UpdateLesionInput = { ...patch, version: base.version };
          const { lesion } = await sendJson<{ lesion: LesionDto }>("PATCH", `${key}/${realId}`, body);
          setServer((d) => ({ ...d, lesions: d.lesions.map((l) => (l.id === lesion.id ? lesion : l)) }));
          update((o) => {
            const edits = new Map(o.edits);
            if (edits.get(realId) === patch) edits.delete(realId);
            return { ...o, edits, status: { ...o.status, [realId]: undefined } };
          });
        } catch (err) {
          onFailure(realId, err, () => ops.current.runEdit(realId), "saved");
        }
      });
    },
    [enqueue, key, setServer, setStatus, update, onFailure],
  );

  const create = useCallback(
    (fields: CreateLesionInput): string => {
      const tempId = `tmp-${++tempCounter}`;
      const lesion: LesionDto = {
        morphology: null, acetowhite: null, lugol: null, vessels: [], sizeMm: null, note: null,
        ...fields,
        id: tempId, visitId, trackId: null, trackLabel: null, label: "New…", zone: "", version: 0,
        histology: null, biopsyLabels: [], treated: false,
      } as LesionDto;
      update((o) => ({ ...o, creates: new Map(o.creates).set(tempId, lesion) }));
      runCreate(tempId);
      return tempId;
    },
    [update, runCreate, visitId],
  );

  const change = useCallback(
    (rawId: string, patch: LesionPatch) => {
      const id = alias.current.get(rawId) ?? rawId;
      const pending = ov.current.creates.get(id);
      if (pending) {
        update((o) => ({ ...o, creates: new Map(o.creates).set(id, { ...pending, ...patch } as LesionDto) }));
        if (ov.current.status[id]?.state === "failed") return; // the retry will send the lot
      } else {
        update((o) => ({ ...o, edits: new Map(o.edits).set(id, { ...o.edits.get(id), ...patch }) }));
      }
      runEdit(id);
    },
    [update, runEdit],
  );

  const remove = useCallback(
    (rawId: string) => {
      const id = alias.current.get(rawId) ?? rawId;
      update((o) => ({ ...o, deletes: new Set(o.deletes).add(id) }));
      const run = () =>
        enqueue(id, async () => {
          const realId = alias.current.get(id) ?? id;
          if (ov.current.creates.has(realId)) {
            update((o) => {
              const creates = new Map(o.creates);
              creates.delete(realId);
              return { ...o, creates, status: { ...o.status, [realId]: undefined } };
            });
            return;
          }
          const base = server.current?.lesions.find((l) => l.id === realId);
          if (!base) return;
          setStatus(realId, { state: "saving" });
          try {
            await sendJson("DELETE", `${key}/${realId}?version=${base.version}`);
            setServer((d) => ({ ...d, lesions: d.lesions.filter((l) => l.id !== realId) }));
            update((o) => ({ ...o, status: { ...o.status, [realId]: undefined } }));
          } catch (err) {
            update((o) => {
              const deletes = new Set(o.deletes);
              deletes.delete(realId);
              return { ...o, deletes };
            });
            onFailure(realId, err, () => ops.current.remove(realId), "deleted");
          }
        });
      run();
    },
    [enqueue, key, setServer, setStatus, update, onFailure],
  );

  useEffect(() => {
    ops.current = { runCreate, runEdit, remove };
  }, [runCreate, runEdit, remove]);

  const lesions = useMemo(() => {
    const base = swr.data?.lesions ?? [];
    const shown = base
      .filter((l) => !overlay.deletes.has(l.id))
      .map((l) => {
        const e = overlay.edits.get(l.id);
        return e ? ({ ...l, ...e } as LesionDto) : l;
      });
    for (const l of overlay.creates.values()) if (!overlay.deletes.has(l.id)) shown.push(l);
    return shown;
  }, [swr.data, overlay]);

  return {
    visit: swr.data?.visit,
    lesions,
    error: swr.error as ApiError | undefined,
    isLoading: swr.isLoading,
    status: overlay.status,
    notice,
    dismissNotice: () => setNotice(null),
    resolveId: (id: string) => overlay.renamed[id] ?? id,
    create,
    change,
    remove,
  };
}
