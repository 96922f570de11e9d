import { topLevel } from "@/lib/bus/overrides";
import type { EngineState } from "@/lib/bus/types";
import type { BenchStateDto } from "@/lib/validation/bench";

const TIMER_WORDS: Record<string, string> = {
  schedule: "Time-of-day trigger",
  named: "Timer",
  vacancy: "No motion since",
  "left-open": "Left open check",
  occupancy: "Occupancy ends",
  "relay-off": "Relay on-time ends",
  "hold-end": "Manual hold ends",
};

/** The sandbox's engine state as the bench shows it: levels with the override holding each, relays, sensors, upcoming timers. */
export function benchStateOf(state: EngineState, nameOf: (id: string) => string): BenchStateDto {
  const holding: BenchStateDto["holding"] = {};
  for (const [id, stack] of Object.entries(state.overrides)) {
    const top = topLevel(stack);
    if (top) holding[id] = { level: top, until: stack[top]!.until };
  }
  const timers = [...state.timers.entries]
    .sort((a, b) => a.due - b.due || a.seq - b.seq)
    .slice(0, 8)
    .map((t) => {
      const p = t.payload;
      const subject = "device" in p ? nameOf(p.device) : "name" in p ? p.name : "zone" in p ? nameOf(p.zone) : p.kind === "schedule" ? p.triggerKey : "";
      return { due: t.due, label: `${TIMER_WORDS[p.kind] ?? p.kind}${subject ? `: ${subject}` : ""}` };
    });
  const s = state.sensors;
  return {
    now: state.now,
    mode: state.mode,
    emergency: { ...state.emergency },
    levels: { ...state.levels },
    holding,
    relays: { ...state.relays },
    sensors: { lux: { ...s.lux }, temperature: { ...s.temperature }, humidity: { ...s.humidity }, contacts: { ...s.contacts }, fireAlarms: { ...s.fireAlarms }, occupied: { ...s.occupied } },
    timers,
  };
}
