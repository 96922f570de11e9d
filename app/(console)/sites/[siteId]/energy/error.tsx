"use client";

import { ErrorPanel } from "@/components/ui/error-panel";

export default function EnergyError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <ErrorPanel title="The energy budget could not be loaded." onRetry={reset} />;
}
