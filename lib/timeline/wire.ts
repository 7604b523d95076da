// The timeline as it travels: a patient with 30 visits × 40 lesions has 1,200 lesions and 1,200
// track statuses, and sent as objects each repeated its key names, its visit's and track's ids
// and its grade words (about 770 KB). Here the long lists go as columns (one array per field,
// each key once), every repeated word (visit and track ids, grades, zones, statuses, reasons)
// as an index into one list of strings, `d`, yes/no as 1/0 and a lesion's uuid in 22 characters.
// The screens read the decoded form, which is exactly the JSON of the timeline as assembled
// (`decodeTimeline(encodeTimeline(t))` equals it).
import type { TimelineDto } from "./assemble";

type Row = Record<string, unknown>;
/** Column-major rows: `k` the field names, `c[i]` the values of field `k[i]`, one per row. */
export interface WireTable {
  k: string[];
  c: unknown[][];
}

export interface TimelineWire {
  /** Format version: a client that reads another answers with an error rather than wrong figures. */
  v: 1;
  d: string[];
  patient: TimelineDto["patient"];
  visits: TimelineDto["visits"];
  tracks: TimelineDto["tracks"];
  reviews: TimelineDto["reviews"];
  lesions: WireTable;
  statuses: WireTable;
  checks: WireTable;
  perVisit: WireTable;
}

// Fields whose values repeat from row to row (ids of the 30 visits and 40 tracks, vocabulary words):
// an index into `d`, or -1 for null.
const WORDS = new Set(["visitId", "trackId", "visitDate", "zone", "grade", "histology", "effectiveGrade", "status", "reason", "outcome"]);
// Yes/no fields: 1 or 0.
const FLAGS = new Set(["treated"]);
// Row ids (a lesion's): the uuid's 16 bytes in base64url, 22 characters instead of 36.
const IDS = new Set(["id"]);

const B64 = "ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_";
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

// Hex digit values by character code (-1 for anything else).
const HEX = new Int8Array(128).fill(-1);
for (let i = 0; i < 16; i++) HEX["0123456789abcdef".charCodeAt(i)] = i;

/** A lowercase uuid as 22 base64url characters; anything else as "~" and itself. */
export function packUuid(id: string): string {
  if (!UUID.test(id)) return `~${id}`;
  // The 32 hex digits and a 0 (128 bits + 4 = 132 bits = 22 sextets), three digits at a time.
  let out = "";
  let n = 0;
  let digits = 0;
  for (let i = 0; i <= 36; i++) {
    const v = i === 36 ? 0 : HEX[id.charCodeAt(i)]!;
    if (v < 0) continue; // a hyphen
    n = (n << 4) | v;
    if (++digits === 3) {
      out += B64[n >> 6]! + B64[n & 63]!;
      n = 0;
      digits = 0;
    }
  }
  return out;
}

export function unpackUuid(packed: string): string {
  if (packed.startsWith("~")) return packed.slice(1);
  let hex = "";
  for (let i = 0; i < 22; i += 2) {
    const n = (B64.indexOf(packed[i]!) << 6) | B64.indexOf(packed[i + 1]!);
    hex += n.toString(16).padStart(3, "0");
  }
  hex = hex.slice(0, 32);
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20)}`;
}

/** How one field's values are written: chosen once per column, not per value. */
function encoderOf(key: string, words: (s: string) => number): (v: unknown) => unknown {
  if (WORDS.has(key)) return (v) => (typeof v === "string" ? words(v) : v === null ? -1 : v);
  if (FLAGS.has(key)) return (v) => (typeof v === "boolean" ? (v ? 1 : 0) : v);
  if (IDS.has(key)) return (v) => (typeof v === "string" ? packUuid(v) : v);
  return (v) => v;
}

function decodeValue(key: string, v: unknown, d: readonly string[]): unknown {
  if (WORDS.has(key)) return typeof v === "number" ? (v === -1 ? null : d[v]) : v;
  if (FLAGS.has(key) && typeof v === "number") return v === 1;
  if (IDS.has(key) && typeof v === "string") return unpackUuid(v);
  return v;
}

function encodeTable(rows: readonly object[], words: (s: string) => number): WireTable {
  const k = rows.length ? Object.keys(rows[0]!) : [];
  const c = k.map((key) => {
    const encode = encoderOf(key, words);
    return rows.map((r) => encode((r as Row)[key]));
  });
  return { k, c };
}

function decodeTable(t: WireTable, d: readonly string[]): Row[] {
  const n = t.c[0]?.length ?? 0;
  const rows: Row[] = Array.from({ length: n }, () => ({}));
  t.k.forEach((key, i) => {
    const col = t.c[i]!;
    for (let j = 0; j < n; j++) rows[j]![key] = decodeValue(key, col[j], d);
  });
  return rows;
}

export function encodeTimeline(t: TimelineDto): TimelineWire {
  const d: string[] = [];
  const index = new Map<string, number>();
  const words = (s: string) => {
    let i = index.get(s);
    if (i === undefined) {
      i = d.push(s) - 1;
      index.set(s, i);
    }
    return i;
  };
  return {
    v: 1,
    d,
    patient: t.patient,
    visits: t.visits,
    tracks: t.tracks,
    reviews: t.reviews,
    lesions: encodeTable(t.lesions, words),
    statuses: encodeTable(t.statuses, words),
    checks: encodeTable(t.checks, words),
    perVisit: encodeTable(t.perVisit, words),
  };
}

/** The timeline as the screens read it (`T` is the assembled timeline as JSON delivers it). */
export function decodeTimeline<T>(w: TimelineWire): T {
  if (w.v !== 1) throw new Error(`Unknown timeline format ${String(w.v)}`);
  return {
    patient: w.patient,
    visits: w.visits,
    tracks: w.tracks,
    lesions: decodeTable(w.lesions, w.d),
    statuses: decodeTable(w.statuses, w.d),
    checks: decodeTable(w.checks, w.d),
    perVisit: decodeTable(w.perVisit, w.d),
    reviews: w.reviews,
  } as T;
}
