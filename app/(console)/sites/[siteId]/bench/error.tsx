"use client";

import { ErrorPanel } from "@/components/ui/error-panel";

export default function BenchError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <ErrorPanel title="The Test bench could not be loaded." onRetry={reset} />;
}
