"use client";

import type { NodeProps } from "@xyflow/react";
import { memo } from "react";
import type { ActionFlowNode } from "../flow";
import { NodeFrame } from "./node-frame";

function ActionNodeView({ data, selected }: NodeProps<ActionFlowNode>) {
  return <NodeFrame rule={data.rule} isSelected={selected} />;
}

export const ActionNode = memo(ActionNodeView);
