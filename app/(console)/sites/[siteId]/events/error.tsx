"use client";

import { ErrorPanel } from "@/components/ui/error-panel";

export default function EventLogError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <ErrorPanel title="The Event log could not be loaded." onRetry={reset} />;
}
