"use client";
import dynamic from "next/dynamic";

/** deck.gl needs the browser (WebGL), so the map is loaded on the client only. */
export const MapLoader = dynamic(() => import("./field-map").then((m) => m.FieldMap), {
  ssr: false,
  loading: () => (
    <p className="text-sm text-ink-faint" aria-busy="true" data-testid="map-loading">
      Loading the map…
    </p>
  ),
});
