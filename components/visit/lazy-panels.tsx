"use client";
// The visit page's panels below the map and the biopsies. Each fetches its own data in the
// browser, so on the server it could only ever render its loading line; loading its code after
// the page's first load costs nothing visible and leaves the map's JavaScript smaller.
import dynamic from "next/dynamic";

export const LazyVisitRecordPanels = dynamic(() => import("./record/visit-record-panels").then((m) => m.VisitRecordPanels), {
  ssr: false,
  loading: () => <p className="text-ink-soft" role="status">Loading the visit record…</p>,
});

export const LazyVisitGallery = dynamic(() => import("./gallery/visit-gallery").then((m) => m.VisitGallery), {
  ssr: false,
  loading: () => <p className="text-sm text-ink-soft" role="status">Loading files…</p>,
});
