"use client";
// The visit's canal map screen: map, inspector and lesion table, saved through SWR.
// A tap or a change of numbering repaints the map first; the inspector, the follow-up list and
// the 200-row table follow once that frame is painted (useAfterPaint, useSelectionAfterPaint),
// so they never hold up the frame that shows the clinician what the finger did. The selection
// lives in a small store (createSelectionStore): a tap renders two lesion shapes and the
// handles, not this screen.
import { memo, useCallback, useEffect, useLayoutEffect, useMemo, useRef, useState } from "react";
import { CONVENTION_LABEL, MapLegend, afterNextFrame, createSelectionStore, useAfterPaint, useSelectionAfterPaint, type GhostLesion, type LesionSaveState, type MapExtent } from "@/components/canal-map";
import { sendJson } from "@/components/data/fetcher";
import { Caution } from "@/components/ui/caution";
import { GRADE_LABEL, GRADES, type Grade } from "@/lib/domain/vocab";
import type { DisplayConvention } from "@/lib/geometry";
import { ConventionSwitch } from "./convention-switch";
import { tapExtent } from "./extent-math";
import { LesionForm } from "./lesion-form";
import { LesionTable } from "./lesion-table";
import { MapEditor } from "./map-editor";
import { useLesionStore, type LesionPatch, type SaveInfo } from "./use-lesion-store";
import type { LesionDto, VisitMapDto } from "@/lib/validation/lesions";
import type { FollowUp } from "@/components/visit/refind/use-follow-up";
import type { LookAgain } from "@/components/visit/refind/use-look-again";
import { FollowUpPanel, GhostCard } from "@/components/visit/refind/follow-up-panel";
import { TrackTools } from "@/components/visit/refind/track-tools";
import { TreatedSummary } from "@/components/visit/refind/treated-summary";
import { HsilExtentNote } from "./hsil-extent-note";
import { useFollowUp } from "@/components/visit/refind/use-follow-up";
import { useLookAgain } from "@/components/visit/refind/use-look-again";
import { useTreatedArcs } from "@/components/visit/refind/use-treated-arcs";
import { ghostStatusWords } from "@/components/visit/refind/look-again";
import { api } from "@/components/data/keys";
import { SideTabs, type SideTab } from "@/components/visit/side-tabs";
import { NumberingNote, useNumbering } from "@/components/visit/numbering";

export interface VisitMapEditorProps {
  visitId: string;
  initialConvention: DisplayConvention;
  /** False for roles that may only read (reviewer, admin); the server refuses their writes anyway. */
  canEdit?: boolean;
  /**
   * The map as the page read it on the server: drawn in the page's first paint, so nothing below
   * it moves when it arrives (without it the map is fetched after load).
   */
  initialMap?: VisitMapDto;
  /** Record sections shown in tabs beside the map after the selected lesion's tab (biopsies, procedure…). */
  sections?: readonly SideTab[];
}

export function VisitMapEditor({ visitId, initialConvention, canEdit = true, initialMap, sections = [] }: VisitMapEditorProps) {
  const store = useLesionStore(visitId, initialMap);
  // Opens in the position of the examination (shared with the rest of the visit page).
  const { conv, setConv, position: examPosition } = useNumbering(initialConvention, store.visit?.patientPosition ?? null);
  const [prefNotice, setPrefNotice] = useState<string | null>(null);
  const [selection] = useState(() => createSelectionStore());
  const [selectedTrack, setSelectedTrack] = useState<string | null>(null);
  const fu = useFollowUp(visitId);
  const look = useLookAgain(fu, store.lesions);
  const treated = useTreatedArcs(visitId);
  const [focusId, setFocusId] = useState<string | null>(null);
  const [confirmId, setConfirmId] = useState<string | null>(null);
  const [newGrade, setNewGrade] = useState<Grade>("lsil");
  const confirmRef = useRef<HTMLButtonElement>(null);

  const readOnly = !canEdit || (store.visit?.readOnly ?? true);
  const { create, change, remove, resolveId } = store;
  // A lesion created here is selected under its temporary id; once the server has named it,
  // the selection follows the new id (before the paint, so the map never shows neither).
  useLayoutEffect(() => {
    const current = selection.get();
    if (current && resolveId(current) !== current) selection.set(resolveId(current));
  });
  // Picking a lesion and picking an earlier outline exclude each other: one inspector.
  const setSelected = useCallback((id: string | null) => {
    selection.set(id);
    if (id) setSelectedTrack(null);
  }, [selection]);
  const onGhostSelect = useCallback((trackId: string) => {
    setSelectedTrack(trackId);
    selection.set(null);
  }, [selection]);
  const fuGhosts = fu.data?.ghosts;
  const ghosts = useMemo<GhostLesion[]>(
    () => (fuGhosts ?? []).map((g) => ({ id: g.trackId, trackLabel: g.trackLabel, grade: g.grade, clockStartH: g.clockStartH, clockEndH: g.clockEndH, distanceStartCm: g.distanceStartCm, distanceEndCm: g.distanceEndCm, statusWords: ghostStatusWords(g).toLowerCase() })),
    [fuGhosts],
  );
  // A lesion saved, moved or deleted changes the suggestions: ask again once the server has it.
  const savedSignature = store.lesions.filter((l) => !l.id.startsWith("tmp-")).map((l) => `${l.id}:${l.version}`).join();
  const revalidateTracks = fu.revalidate;
  const lastSignature = useRef(savedSignature);
  useEffect(() => {
    if (lastSignature.current === savedSignature) return;
    lastSignature.current = savedSignature;
    void revalidateTracks();
  }, [savedSignature, revalidateTracks]);

  const saveStates = useMemo(() => {
    const out: Record<string, LesionSaveState | undefined> = {};
    for (const [id, s] of Object.entries(store.status)) out[id] = s?.state;
    return out;
  }, [store.status]);

  const onCreate = useCallback(
    (e: MapExtent) => {
      const id = create({ ...e, grade: newGrade, vessels: [] });
      setSelected(id);
      return id;
    },
    [create, newGrade, setSelected],
  );
  const onChange = useCallback((id: string, e: MapExtent) => change(id, e), [change]);
  const onRequestDelete = useCallback((id: string) => setConfirmId(id), []);

  useEffect(() => {
    if (confirmId) confirmRef.current?.focus();
  }, [confirmId]);

  const onCommitSelected = useCallback((id: string, patch: LesionPatch) => change(id, patch), [change]);
  const closeTrack = useCallback(() => setSelectedTrack(null), []);
  // Everything beside and below the map: shown as it was until the map's frame is painted,
  // then brought up to date. One memoised value, so the panels always show the same moment
  // and change only when their parts do; the selection arrives the same way, from the store.
  const showGhostKey = ghosts.length > 0;
  const later = useAfterPaint(
    useMemo(
      () => ({ lesions: store.lesions, status: store.status, conv, readOnly, selectedTrack, fu, look, treated, showGhostKey }),
      [store.lesions, store.status, conv, readOnly, selectedTrack, fu, look, treated, showGhostKey],
    ),
  );
  const shownId = useSelectionAfterPaint(selection);
  const selectedId = shownId ? resolveId(shownId) : null;
  const inspector = useMemo<InspectorProps>(
    () => ({
      selected: later.lesions.find((l) => l.id === selectedId) ?? null,
      saveInfo: selectedId ? later.status[selectedId] : undefined,
      selectedTrack: later.selectedTrack, conv: later.conv, readOnly: later.readOnly, fu: later.fu, look: later.look, lesions: later.lesions,
      onCommit: onCommitSelected, onDelete: onRequestDelete, onCloseTrack: closeTrack,
    }),
    [later, selectedId, onCommitSelected, onRequestDelete, closeTrack],
  );
  const below = useMemo<BelowMapProps>(
    () => ({
      treated: later.treated, fu: later.fu, look: later.look, lesions: later.lesions, conv: later.conv, readOnly: later.readOnly,
      selectedTrack: later.selectedTrack, onSelectTrack: onGhostSelect, selectedId, status: later.status, onSelect: setSelected, showGhostKey: later.showGhostKey,
    }),
    [later, selectedId, onGhostSelect, setSelected],
  );

  const chooseConvention = async (next: DisplayConvention) => {
    const before = conv;
    setConv(next);
    // Saved for next time once the turned map and the panels after it are painted: starting a
    // request costs a frame a few milliseconds, and nothing on screen waits for it.
    await new Promise<void>((done) => afterNextFrame(done));
    try {
      await sendJson("PATCH", api.preferences, { displayConvention: next });
      setPrefNotice(null);
    } catch {
      setPrefNotice(`Showing ${CONVENTION_LABEL[next]} numbering here, but the choice could not be saved for next time (was ${CONVENTION_LABEL[before]}).`);
    }
  };

  if (store.error && !store.visit) {
    return <Caution tone="danger" title="The map could not be loaded">{store.error.message}</Caution>;
  }
  if (!store.visit) return <p role="status" className="text-ink-soft">Loading the map…</p>;

  const confirmLesion = store.lesions.find((l) => l.id === confirmId);
  const position = store.visit.patientPosition;

  return (
    <div className="flex flex-col gap-3">
      {readOnly ? (
        <div role="status" className="rounded-md border-l-4 border-rule-strong bg-panel px-3 py-2 text-sm">
          <p className="font-bold">Read only</p>
          <p>{store.visit.status === "signed" ? "This visit is signed: the map is shown as recorded and cannot be changed." : "You can view this map but not change it."}</p>
        </div>
      ) : null}
      {store.notice ? (
        <div className="flex items-start gap-2">
          <div className="flex-1"><Caution tone={store.notice.tone} title={store.notice.text} /></div>
          <button type="button" onClick={store.dismissNotice} className="min-h-11 rounded-md border border-rule-strong bg-panel px-3 text-sm font-semibold">Dismiss</button>
        </div>
      ) : null}
      {prefNotice ? <Caution title={prefNotice} /> : null}

      <div className="flex flex-wrap items-center gap-3">
        <ConventionSwitch value={conv} onChange={(v) => void chooseConvention(v)} />
        <NumberingNote position={examPosition ?? position} conv={conv} />
        {!readOnly ? (
          <div className="ml-auto flex flex-wrap items-center gap-2">
            <label className="text-sm font-semibold">
              New lesions:{" "}
              <select value={newGrade} onChange={(e) => setNewGrade(e.target.value as Grade)} className="min-h-11 rounded-md border border-rule-strong bg-panel px-2">
                {GRADES.map((g) => <option key={g} value={g}>{GRADE_LABEL[g]}</option>)}
              </select>
            </label>
            <button
              type="button"
              onClick={() => setFocusId(onCreate(tapExtent(0, 1, conv)))}
              className="min-h-11 rounded-md bg-lagoon-600 px-4 font-semibold text-white hover:bg-lagoon-700"
            >
              New lesion
            </button>
          </div>
        ) : null}
      </div>

      {confirmLesion ? (
        <div role="alertdialog" aria-label={`Delete lesion ${confirmLesion.label}?`} className="flex flex-wrap items-center gap-3 rounded-md border border-danger-rule bg-danger-bg px-3 py-2 text-danger-ink">
          <span className="font-semibold">Delete lesion {confirmLesion.label}? Its details go with it.</span>
          <button ref={confirmRef} type="button" className="min-h-11 rounded-md bg-danger-ink px-4 font-semibold text-white" onClick={() => { remove(confirmLesion.id); setConfirmId(null); setSelected(null); }}>Delete</button>
          <button type="button" className="min-h-11 rounded-md border border-rule-strong bg-panel px-4 font-semibold text-ink" onClick={() => setConfirmId(null)}>Keep</button>
        </div>
      ) : null}

      {/* The map stays in view (sticky) while the section beside it scrolls: on a tablet the
          clinician sees the map and the biopsy, dose or treatment being recorded together. */}
      <div className="grid gap-4 md:grid-cols-[minmax(0,1fr)_minmax(320px,1fr)] xl:grid-cols-[minmax(0,3fr)_minmax(380px,2fr)]">
        <div className="self-start rounded-lg border border-rule bg-panel p-2 [contain:layout_paint] md:sticky md:top-2" data-map-column>
          <MemoMapEditor
            lesions={store.lesions}
            convention={conv}
            readOnly={readOnly}
            selection={selection}
            onSelect={setSelected}
            onCreate={onCreate}
            onChange={onChange}
            onRequestDelete={onRequestDelete}
            saveStates={saveStates}
            ghosts={ghosts}
            onGhostSelect={onGhostSelect}
            selectedGhostId={selectedTrack}
            treatedArcs={treated.arcs}
            focusId={focusId}
            newGrade={newGrade}
          />
          <HsilExtentNote lesions={store.lesions} />
          <TreatedSummary extent={below.treated.extent} cautionFraction={below.treated.cautionFraction} />
        </div>
        <SideTabs
          label="Visit sections"
          tabs={[{ id: "lesion", label: "Lesion", content: <><Inspector {...inspector} /><FollowUpBeside {...below} /></> }, ...sections]}
        />
      </div>
      <BelowMap {...below} />
    </div>
  );
}

const MemoMapEditor = memo(MapEditor);


interface InspectorProps {
  selected: LesionDto | null;
  saveInfo: SaveInfo | undefined;
  selectedTrack: string | null;
  conv: DisplayConvention;
  readOnly: boolean;
  fu: FollowUp;
  look: LookAgain;
  lesions: readonly LesionDto[];
  onCommit: (id: string, patch: LesionPatch) => void;
  onDelete: (id: string) => void;
  onCloseTrack: () => void;
}

/** The selected lesion's form and track, or the selected earlier outline's card. */
const Inspector = memo(function Inspector({ selected, saveInfo, selectedTrack, conv, readOnly, fu, look, lesions, onCommit, onDelete, onCloseTrack }: InspectorProps) {
  return (
    <aside aria-label="Selected lesion" className="rounded-lg border border-rule bg-panel p-3 [contain:content]">
      {selectedTrack ? (
        <GhostCard fu={fu} look={look} conv={conv} readOnly={readOnly} trackId={selectedTrack} onClose={onCloseTrack} />
      ) : selected ? (
        <>
          <LesionForm
            key={selected.id}
            lesion={selected}
            convention={conv}
            readOnly={readOnly}
            saveInfo={saveInfo}
            onCommit={(patch) => onCommit(selected.id, patch)}
            onDelete={() => onDelete(selected.id)}
          />
          {fu.data ? <TrackTools fu={fu} lesion={selected} lesions={lesions} readOnly={readOnly} /> : null}
        </>
      ) : (
        <p className="text-ink-soft">{readOnly ? "Select a lesion on the map or in the table to see its details." : "Tap the map where you see a lesion, or drag to sweep its extent. Select a lesion to edit it here."}</p>
      )}
    </aside>
  );
});

interface BelowMapProps {
  treated: ReturnType<typeof useTreatedArcs>;
  fu: FollowUp;
  look: LookAgain;
  lesions: readonly LesionDto[];
  conv: DisplayConvention;
  readOnly: boolean;
  selectedTrack: string | null;
  onSelectTrack: (trackId: string) => void;
  selectedId: string | null;
  status: Readonly<Record<string, SaveInfo | undefined>>;
  onSelect: (id: string | null) => void;
  showGhostKey: boolean;
}

/** The earlier tracks to look for, under the selected lesion. */
const FollowUpBeside = memo(function FollowUpBeside({ fu, look, lesions, conv, readOnly, selectedTrack, onSelectTrack }: BelowMapProps) {
  return (
    <div className="mt-3 flex flex-col gap-3">
      <FollowUpPanel fu={fu} look={look} lesions={lesions} conv={conv} readOnly={readOnly} selectedTrackId={selectedTrack} onSelectTrack={onSelectTrack} />
    </div>
  );
});

/** The lesion table and the key, under the map and its sections. */
const BelowMap = memo(function BelowMap({ lesions, conv, selectedId, status, onSelect, showGhostKey }: BelowMapProps) {
  return (
    <>
      {/* Below the fold on a tablet: the browser skips its layout and paint until it scrolls near. */}
      <div className="[content-visibility:auto] [contain-intrinsic-size:auto_40rem]">
        <LesionTable lesions={lesions} conv={conv} selectedId={selectedId} status={status} onSelect={onSelect} />
      </div>
      <MapLegend showGhosts={showGhostKey} />
    </>
  );
});
