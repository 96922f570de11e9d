"use client";

import type { NodeProps } from "@xyflow/react";
import { memo } from "react";
import type { GateFlowNode } from "../flow";
import { NodeFrame } from "./node-frame";

function GateNodeView({ data, selected }: NodeProps<GateFlowNode>) {
  return <NodeFrame rule={data.rule} isSelected={selected} />;
}

export const GateNode = memo(GateNodeView);
