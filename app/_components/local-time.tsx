"use client";
import { useEffect, useState } from "react";
import { formatDate, formatInZone } from "./ui";

/**
 * A time with no field to take a time zone from (team, keys, outbox, activity of the whole organisation): shown in
 * the browser's own time zone once on the page, the UTC instant on hover. The server's first render says UTC, so the
 * text never differs between server and browser before the page is live.
 */
export function LocalTime({ iso }: { iso: string }) {
  const [zone, setZone] = useState<string | null>(null);
  useEffect(() => setZone(Intl.DateTimeFormat().resolvedOptions().timeZone), []);
  return (
    <time dateTime={iso} title={formatDate(iso)} data-testid="local-time">
      {zone ? formatInZone(iso, zone) : formatDate(iso)}
    </time>
  );
}
