import { ROLE_LABEL, ROLES, type Role } from "@/lib/auth/roles";

export function RoleSelect({ value, onChange, id, disabled, label }: { value: Role; onChange: (r: Role) => void; id?: string; disabled?: boolean; label?: string }) {
  return (
    <select id={id} aria-label={label} value={value} disabled={disabled} onChange={(e) => onChange(e.target.value as Role)} className="rounded-md border border-line bg-paper px-2 py-1">
      {ROLES.map((r) => (
        <option key={r} value={r}>
          {ROLE_LABEL[r]}
        </option>
      ))}
    </select>
  );
}
