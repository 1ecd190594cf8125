"use client";

/** Which machine recorded the as-planted file (optional): its audits then join the machine's season. */
export function MachinePicker({
  machines,
  value,
  onChange,
  disabled,
}: {
  machines: { id: string; name: string; toolArms: number }[];
  value: string;
  onChange: (id: string) => void;
  disabled?: boolean;
}) {
  return (
    <div className="mt-4">
      <label htmlFor="upload-machine" className="mb-1 block text-sm font-medium">
        Machine that recorded the file (optional)
      </label>
      <select
        id="upload-machine"
        value={value}
        disabled={disabled}
        onChange={(e) => onChange(e.target.value)}
        className="w-full max-w-sm rounded-plot border border-chalk-line bg-white px-3 py-2 text-base"
        data-testid="upload-machine"
      >
        <option value="">Not named</option>
        {machines.map((m) => (
          <option key={m.id} value={m.id}>
            {m.name} ({m.toolArms} arms)
          </option>
        ))}
      </select>
      <p className="mt-1 text-xs text-ink-faint">
        {machines.length
          ? "Its audits are then compared with the same machine's previous audit and shown in the machine's season."
          : "No machines yet: QA leads and owners add them under Machines."}
      </p>
    </div>
  );
}
