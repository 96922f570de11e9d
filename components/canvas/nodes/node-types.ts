import { ActionNode } from "./action-node";
import { GateNode } from "./gate-node";
import { TriggerNode } from "./trigger-node";

/** Defined once at module level so React Flow never sees a new object and remounts every node. */
export const nodeTypes = { trigger: TriggerNode, gate: GateNode, action: ActionNode };
