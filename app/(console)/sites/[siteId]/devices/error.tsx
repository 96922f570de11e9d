"use client";

import { ErrorPanel } from "@/components/ui/error-panel";

export default function DevicesError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <ErrorPanel title="The devices could not be loaded." onRetry={reset} />;
}
