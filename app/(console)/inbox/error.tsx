"use client";

import { ErrorPanel } from "@/components/ui/error-panel";

export default function InboxError({ reset }: { error: Error; reset: () => void }) {
  return <ErrorPanel title="The inbox could not be shown." detail="Try again in a moment." onRetry={reset} />;
}
