/** Occupant zones: none ticked means the whole site. */
export function ZonePicker({ zones, value, onChange, legend }: { zones: { id: string; name: string }[]; value: string[] | null; onChange: (v: string[] | null) => void; legend: string }) {
  const selected = new Set(value ?? []);
  return (
    <fieldset className="flex flex-col gap-1">
      <legend className="text-sm font-semibold">{legend}</legend>
      <p className="text-xs text-slate">Leave all unticked for the whole site.</p>
      <div className="mt-1 grid grid-cols-2 gap-1">
        {zones.map((z) => (
          <label key={z.id} className="flex items-center gap-2 text-sm">
            <input
              type="checkbox"
              checked={selected.has(z.id)}
              onChange={(e) => {
                const next = new Set(selected);
                if (e.target.checked) next.add(z.id);
                else next.delete(z.id);
                onChange(next.size ? [...next] : null);
              }}
            />
            {z.name}
          </label>
        ))}
      </div>
    </fieldset>
  );
}
