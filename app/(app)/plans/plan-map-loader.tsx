"use client";
import dynamic from "next/dynamic";

/** deck.gl needs the browser (WebGL), so the plan's map is loaded on the client only. */
export const PlanMapLoader = dynamic(() => import("./plan-map").then((m) => m.PlanMap), {
  ssr: false,
  loading: () => (
    <p className="text-sm text-ink-faint" aria-busy="true" data-testid="plan-map-loading">
      Loading the map…
    </p>
  ),
});
