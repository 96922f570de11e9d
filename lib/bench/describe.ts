import type { BenchAction } from "@/lib/validation/bench";

/** A bench action in words, for the feed and scenario lists. */
export function describeAction(action: BenchAction, nameOf: (id: string) => string): string {
  switch (action.type) {
    case "press":
      return `Press button ${action.button} on ${nameOf(action.device)}`;
    case "release":
      return `Release button ${action.button} on ${nameOf(action.device)}`;
    case "long-press":
      return `Long press button ${action.button} on ${nameOf(action.device)}`;
    case "call":
      return `Press ${nameOf(action.device)}`;
    case "turn":
      return `Turn ${nameOf(action.device)}`;
    case "walk-past":
      return `Walk past ${nameOf(action.device)}`;
    case "contact":
      return `${action.state === "open" ? "Open" : "Close"} ${nameOf(action.device)}`;
    case "reading": {
      const unit = action.measure === "light-level" ? "lx" : action.measure === "temperature" ? "°C" : "%RH";
      return `${nameOf(action.device)} reads ${action.value} ${unit}`;
    }
    case "fire-alarm":
      return `${action.state === "active" ? "Trip" : "Clear"} ${nameOf(action.device)}`;
    case "clear-emergency":
      return "Clear the emergency latch";
    case "skip":
      return `Skip ahead ${action.minutes} min`;
    case "skip-to":
      return `Skip ahead to ${action.time}`;
    case "set-date":
      return `Set the date to ${action.date} ${action.time}`;
  }
}
