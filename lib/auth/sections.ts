import { can, type Permission } from "./permissions";
import type { Role } from "./roles";

/** The console's site sections and the permission each needs; later issues add theirs here. */
const SECTIONS: { href: string; label: string; permission: Permission }[] = [
  { href: "", label: "Overview", permission: "site.view" },
  { href: "/canvas", label: "Canvas", permission: "rules.edit" },
  { href: "/bench", label: "Test bench", permission: "bench.use" },
  { href: "/events", label: "Event log", permission: "replay.use" },
  { href: "/replay", label: "Replay", permission: "replay.use" },
  { href: "/energy", label: "Energy", permission: "energy.view" },
  { href: "/devices", label: "Devices", permission: "inventory.view" },
  { href: "/plan", label: "Plan", permission: "inventory.view" },
  { href: "/scenes", label: "Scenes", permission: "scenes.edit" },
  { href: "/keys", label: "Gateway keys", permission: "gateway-keys.manage" },
  { href: "/members", label: "Members", permission: "members.manage" },
  { href: "/settings", label: "Settings", permission: "site.edit" },
];

export function sectionsFor(role: Role) {
  return SECTIONS.filter((s) => can(role, s.permission)).map(({ href, label }) => ({ href, label }));
}
