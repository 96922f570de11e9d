"use client";

import { ErrorPanel } from "@/components/ui/error-panel";

export default function CanvasError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <ErrorPanel title="The Canvas could not be loaded." onRetry={reset} />;
}
