import type { DeviceKind } from "@/lib/catalogue/device-kinds";
import type { RuleTrace } from "@/lib/rules/evaluate";
import type { OverrideLevel } from "@/lib/rules/trigger-key";
import type { SiteClock } from "@/lib/sun/schedule";
import type { NoticeKind } from "@/lib/rules/notice-kind";
import type { TimerEntry } from "./timer-queue";

export type SiteConfig = SiteClock & {
  /** The gateway's own unicast address: the source of every command, and the key of its TID counter. */
  gatewayAddress?: number;
  /** TTL put on commands (0 or 2–127). */
  ttl?: number;
  /** A motion sensor's zone counts as occupied for this long after its last motion. */
  occupancyMinutes?: number;
  /** The site mode before any rule sets one. */
  initialMode?: string;
};
export type DeviceConfig = { id: string; kind: DeviceKind; zoneId: string | null; unicastAddress: number; name?: string };
export type ZoneConfig = { id: string; groupAddress: number | null; name?: string };
export type SceneLevel = { zoneId?: string; deviceId?: string; level: number };
export type SceneConfig = { number: number; name: string; fadeMs: number; levels: SceneLevel[] };

/** A raw report from the gateway or the Test bench; `id` makes ingesting it twice harmless (schema: ./event.ts). */
export type DeviceEvent = { id: string; siteId: string; at: number; device: string; kind: string; value: number | boolean | string | null };

export type Slot = { level: number; until: number | null };
export type OverrideStack = Partial<Record<OverrideLevel, Slot>>;

/** Everything the engine remembers between events; plain JSON so a live store can persist it. */
export type EngineState = {
  version: 1;
  /** The virtual clock; null until the first event or advanceTo. */
  now: number | null;
  mode: string;
  emergency: { active: boolean; since: number | null; scene: number | null; ruleId: string | null };
  levels: Record<string, number>;
  overrides: Record<string, OverrideStack>;
  relays: Record<string, boolean>;
  sensors: {
    lux: Record<string, number>;
    temperature: Record<string, number>;
    humidity: Record<string, number>;
    /** Per threshold watch key: which side of it the reading last settled on. */
    sides: Record<string, "above" | "below">;
    contacts: Record<string, "open" | "closed">;
    fireAlarms: Record<string, boolean>;
    occupied: Record<string, boolean>;
    /** "device|button" → time of the press, to tell a long press on release. */
    pressedAt: Record<string, number>;
  };
  timers: { nextSeq: number; entries: TimerEntry[] };
  /** Next TID per source address ("0x7FFF"). */
  tids: Record<string, number>;
  /** Most recent event ids, oldest first, to drop repeats. */
  recentEventIds: string[];
};

/** Why an output exists: a rule's action, or the engine itself (reason) when a hold or timer ends. */
export type Cause = { origin: string; ruleId: string | null; actionId: string | null; reason?: SystemReason };
export type SystemReason = "zone-vacant" | "hold-ended" | "relay-time-up" | "cleared-by-person";

export type StateChange = Cause & { at: number } & (
    | { kind: "level"; deviceId: string; from: number; to: number; source: OverrideLevel | null }
    | { kind: "relay"; deviceId: string; isOn: boolean }
    | { kind: "mode"; from: string; to: string }
    | { kind: "emergency"; isActive: boolean; scene: number | null }
  );

export type CommandMessage = "generic-onoff-set-unack" | "light-lightness-set-unack" | "scene-recall-unack";

export type GatewayCommand = Cause & {
  at: number;
  source: number;
  destination: number;
  addressing: "group" | "unicast";
  message: CommandMessage;
  tid: number;
  ttl: number;
  /** Transition time octet when the message carries one. */
  transition: number | null;
  /** The access message, "82 4D 00 80 07 4A 00". */
  bytes: string;
  /** The luminaires or relay it is meant for. */
  devices: string[];
};

export type Notice = Cause & { at: number; dedupeKey: string; recipient: string; channels: string[]; text: string; kind: NoticeKind; zoneId: string | null };

export type ActionTrace = { ruleId: string | null; actionId: string | null; type: string; outcome: string };

/** One thing that happened (a trigger, or a system event) with every candidate rule and what was done. */
export type TraceEntry = {
  at: number;
  origin: string;
  trigger: { key: string | null; type: string; device: string | null; value: unknown };
  rules: RuleTrace[];
  actions: ActionTrace[];
  note?: string;
};

export type Step = {
  input: { eventId: string } | { advanceTo: number };
  at: number;
  isDuplicate: boolean;
  changes: StateChange[];
  commands: GatewayCommand[];
  notices: Notice[];
  /** Every action carried out, by rules or by the engine's own timers, in order (the trace holds them too, when it is kept). */
  actions: ActionTrace[];
  /** Ids of the rules that passed, in the order they ran. */
  fired: string[];
  /** Triggers in this step that had candidate rules (0: no rule waited for anything it caused). */
  matched: number;
  /** Empty when the engine runs without a trace (a replay's fast mode; see createReplayEngine). */
  trace: TraceEntry[];
};
