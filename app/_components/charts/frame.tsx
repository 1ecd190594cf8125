/** Chart colours (the Plotproof palette) and the figure frame every chart sits in. */
export const CHART = {
  ink: "#1d2a24",
  soft: "#44524b",
  leaf: "#2f6b45",
  alarm: "#b3362b",
  stake: "#d99a1e",
  loam: "#7a4b2a",
  grid: "#ebe7dc",
  axis: "#7b8781",
  bar: "#7aa386",
} as const;

/**
 * A chart as a figure: the caption carries the key figures in words (the text alternative),
 * the legend is plain HTML so it is read and zoomed with the page.
 */
export function ChartFigure({
  caption,
  legend,
  children,
  testId,
  note,
}: {
  caption: React.ReactNode;
  /** Small print under the chart (what is not drawn). */
  note?: React.ReactNode;
  legend?: { label: string; swatch: React.ReactNode }[];
  children: React.ReactNode;
  testId?: string;
}) {
  return (
    <figure className="rounded-plot border border-chalk-line bg-white p-4" data-testid={testId}>
      <div aria-hidden="true">{children}</div>
      {legend?.length ? (
        <ul className="mt-2 flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-soft" aria-label="Legend">
          {legend.map((l) => (
            <li key={l.label} className="inline-flex items-center gap-1.5">
              {l.swatch}
              {l.label}
            </li>
          ))}
        </ul>
      ) : null}
      {note ? <p className="mt-1 text-xs text-ink-faint">{note}</p> : null}
      <figcaption className="mt-2 text-sm text-ink-soft">{caption}</figcaption>
    </figure>
  );
}
