/** Pass / fail shown by icon and word, never by colour alone. */
export function PassMark({
  passed,
  passWord = "Pass",
  failWord = "Fail",
  size = "sm",
}: {
  passed: boolean;
  passWord?: string;
  failWord?: string;
  size?: "sm" | "lg";
}) {
  const box = size === "lg" ? "h-6 w-6" : "h-4 w-4";
  return (
    <span
      className={`inline-flex items-center gap-1.5 font-semibold ${passed ? "text-leaf" : "text-alarm"} ${size === "lg" ? "text-lg" : "text-sm"}`}
      data-pass={passed ? "true" : "false"}
    >
      {passed ? (
        <svg viewBox="0 0 16 16" className={box} aria-hidden="true">
          <circle cx="8" cy="8" r="7" fill="currentColor" />
          <path
            d="M4.5 8.3l2.3 2.3 4.7-5"
            stroke="#fff"
            strokeWidth="1.8"
            fill="none"
            strokeLinecap="round"
            strokeLinejoin="round"
          />
        </svg>
      ) : (
        <svg viewBox="0 0 16 16" className={box} aria-hidden="true">
          <rect x="1" y="1" width="14" height="14" rx="2" fill="currentColor" />
          <path d="M5 5l6 6M11 5l-6 6" stroke="#fff" strokeWidth="1.8" strokeLinecap="round" />
        </svg>
      )}
      <span>{passed ? passWord : failWord}</span>
    </span>
  );
}

/** Within / out of tolerance for one plant or group. */
export function WithinMark({ within }: { within: boolean | null }) {
  if (within === null) return <span className="text-ink-faint">–</span>;
  return <PassMark passed={within} passWord="Within" failWord="Out" />;
}
