// Formatting helpers for the record's panels. The words for stored codes live in
// lib/domain/labels.ts (one set for the screens, the PDF and FHIR).

export function formatDateTime(iso: string | null | undefined): string {
  if (!iso) return "";
  return new Date(iso).toLocaleString("en-GB", { dateStyle: "medium", timeStyle: "short" });
}

export const round1 = (n: number) => Math.round(n * 10) / 10;
