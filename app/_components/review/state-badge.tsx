import { STATE_NAME, isLifecycleState } from "@/lib/review/lifecycle";

const TONE: Record<string, string> = {
  computing: "border-chalk-line bg-chalk text-ink-soft",
  computed: "border-chalk-line bg-white text-ink",
  failed: "border-alarm bg-alarm-pale text-alarm",
  submitted: "border-stake bg-stake-pale text-ink",
  signed_off: "border-leaf bg-leaf-pale text-leaf-deep",
  returned: "border-alarm bg-alarm-pale text-alarm",
};

/** The audit's review state as a small label in our own words. */
export function StateBadge({ state, size = "sm" }: { state: string; size?: "sm" | "lg" }) {
  const name = isLifecycleState(state) ? STATE_NAME[state] : state;
  return (
    <span
      className={`inline-flex items-center gap-1 rounded-plot border font-medium ${size === "lg" ? "px-3 py-1 text-base" : "px-2 py-0.5 text-xs"} ${TONE[state] ?? TONE.computed}`}
      data-testid="state-badge"
      data-state={state}
    >
      {state === "signed_off" ? <span aria-hidden>✓</span> : state === "returned" ? <span aria-hidden>↩</span> : null}
      {name}
    </span>
  );
}
