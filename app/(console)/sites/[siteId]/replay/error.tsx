"use client";

import { ErrorPanel } from "@/components/ui/error-panel";

export default function ReplayError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <ErrorPanel title="Replay could not be loaded." onRetry={reset} />;
}
