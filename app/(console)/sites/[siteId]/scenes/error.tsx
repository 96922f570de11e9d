"use client";

import { ErrorPanel } from "@/components/ui/error-panel";

export default function ScenesError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <ErrorPanel title="The scenes could not be loaded." onRetry={reset} />;
}
