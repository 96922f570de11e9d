"use client";

import type { NodeProps } from "@xyflow/react";
import { memo } from "react";
import type { TriggerFlowNode } from "../flow";
import { NodeFrame } from "./node-frame";

function TriggerNodeView({ data, selected }: NodeProps<TriggerFlowNode>) {
  return <NodeFrame rule={data.rule} isSelected={selected} />;
}

export const TriggerNode = memo(TriggerNodeView);
