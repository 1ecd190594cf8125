"use client";
import { useState } from "react";

/**
 * The map's controls on a phone or tablet: below the map, folded behind one large button so the map is the first
 * thing on screen; from 1024 px up they stand open beside it.
 */
export function FilterDrawer({ children }: { children: React.ReactNode }) {
  const [open, setOpen] = useState(false);
  return (
    <div className="order-2 lg:order-none">
      <button
        type="button"
        aria-expanded={open}
        aria-controls="map-filter-drawer"
        data-testid="map-filters-button"
        onClick={() => setOpen((o) => !o)}
        className="flex min-h-11 w-full items-center justify-between rounded-plot border border-ink-faint bg-white px-4 text-sm font-medium lg:hidden"
      >
        Layers and filters
        <span aria-hidden="true">{open ? "▲" : "▼"}</span>
      </button>
      <div
        id="map-filter-drawer"
        className={`${open ? "block" : "hidden"} mt-2 rounded-plot border border-chalk-line bg-white p-4 lg:mt-0 lg:block lg:border-0 lg:bg-transparent lg:p-0`}
      >
        {children}
      </div>
    </div>
  );
}
