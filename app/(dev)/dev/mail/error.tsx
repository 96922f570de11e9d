"use client";

import { ErrorPanel } from "@/components/ui/error-panel";

export default function DevMailError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <ErrorPanel title="The mail sink inbox could not be loaded." onRetry={reset} />;
}
