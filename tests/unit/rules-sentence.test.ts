import { describe, expect, it } from "vitest";
import { demoRuleGraph } from "@/lib/rules/demo-graph";
import { chainEdges, parseRuleGraph, type RuleGraphInput } from "@/lib/rules/graph";
import { daysWords, graphSentences, list, nodeSubject, timeWords, type SiteNames } from "@/lib/rules/sentence";

const names: SiteNames = {
  devices: { "dev-path": "the path sensor", "dev-back": "Back door contact", "dev-fan": "Workshop fan" },
  zones: { "zone-path": "Front path" },
  scenes: { "5": "Path welcome" },
  people: { "u-flat": "Flat", "u-ann": "Ann" },
};
type N = RuleGraphInput["nodes"][number];
const graph = (nodes: N[], edges: RuleGraphInput["edges"]) => parseRuleGraph({ nodes, edges });

describe("paths as plain sentences", () => {
  it("writes the issue's example: trigger, gate, two actions", () => {
    const g = graph(
      [
        { id: "t", kind: "trigger", type: "motion-detected", params: { device: "dev-path" } },
        { id: "g", kind: "gate", type: "time-window", params: { from: { kind: "sunset" }, to: { kind: "fixed", time: "06:00" } } },
        { id: "a1", kind: "action", type: "recall-scene", params: { scene: 5 } },
        { id: "a2", kind: "action", type: "notice", params: { to: { people: ["u-flat"] }, channels: ["push"], text: "Visitor" } },
      ],
      [...chainEdges("t", "g", "a1"), ...chainEdges("g", "a2")],
    );
    expect(graphSentences(g, names)).toEqual([
      { id: "t>g", triggerId: "t", nodeIds: ["t", "g", "a1", "a2"], text: "When the path sensor sees motion, only between sunset and 06:00, recall “Path welcome” and notify Flat by push: “Visitor”" },
    ]);
  });

  it("writes the back-door rule with units, roles and every channel", () => {
    const g = graph(
      [
        { id: "t", kind: "trigger", type: "contact-left-open", params: { device: "dev-back", minutes: 10 } },
        { id: "g", kind: "gate", type: "site-mode-is", params: { modes: ["closed", "away"] } },
        { id: "a", kind: "action", type: "notice", params: { to: { role: "integrator" }, channels: ["push", "in-app", "email"], text: "Back door open" } },
      ],
      chainEdges("t", "g", "a"),
    );
    expect(graphSentences(g, names)[0].text).toBe(
      "When Back door contact is left open for 10 min, only when the site mode is closed or away, notify the integrators by push, in-app and e-mail: “Back door open”",
    );
  });

  it("names what is missing instead of hiding it", () => {
    const g = graph([{ id: "t", kind: "trigger", type: "temperature-above", params: { device: "gone", celsius: 28.5 } }, { id: "a", kind: "action", type: "relay-on-for", params: { device: "dev-fan", minutes: 30 } }], chainEdges("t", "a"));
    expect(graphSentences(g, names)[0].text).toBe("When device “gone” (not on this site) reads above 28.5 °C, switch Workshop fan on for 30 min");
  });

  it("gives one sentence per trigger and gate chain of the demo Rule set, each starting with When", () => {
    const s = graphSentences(demoRuleGraph, { devices: {}, zones: {}, scenes: {}, people: {} });
    // Paths sharing a trigger and gate chain are one rule: the fire alarm's three actions make one sentence.
    expect(new Set(s.map((x) => x.id)).size).toBe(s.length);
    expect(s.every((x) => x.text.startsWith("When "))).toBe(true);
    expect(s.find((x) => x.triggerId === "t-fire")?.nodeIds).toEqual(["t-fire", "a-latch", "a-fire-notice-manager", "a-fire-notice-flat"]);
  });

  it("words times, days and lists plainly", () => {
    expect(timeWords({ kind: "sunset", offsetMinutes: -30 })).toBe("30 min before sunset");
    expect(timeWords({ kind: "sunrise", offsetMinutes: 15 })).toBe("15 min after sunrise");
    expect(daysWords(["fri", "mon", "tue", "wed", "thu"])).toBe("on weekdays");
    expect(daysWords(["sun", "sat"])).toBe("at weekends");
    expect(daysWords(["mon", "wed"])).toBe("on Mon and Wed");
    expect(list(["a", "b", "c"], "or")).toBe("a, b or c");
  });

  it("shows each node's device or zone and key parameter with units", () => {
    const g = graph(
      [
        { id: "t", kind: "trigger", type: "humidity-above", params: { device: "dev-path", percent: 65 } },
        { id: "a", kind: "action", type: "set-level", params: { target: { zone: "zone-path" }, level: 40, fadeMs: 2500 } },
      ],
      chainEdges("t", "a"),
    );
    expect(nodeSubject(g.nodes[0], names)).toEqual({ subject: "the path sensor", detail: "above 65 %RH" });
    expect(nodeSubject(g.nodes[1], names)).toEqual({ subject: "Front path", detail: "40 % over 2.5 s" });
  });
});
