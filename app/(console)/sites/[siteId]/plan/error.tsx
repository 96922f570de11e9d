"use client";

import { ErrorPanel } from "@/components/ui/error-panel";

export default function PlanError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <ErrorPanel title="The plan could not be loaded." onRetry={reset} />;
}
