"use client";

import { ErrorPanel } from "@/components/ui/error-panel";

export default function DevPushError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <ErrorPanel title="The push service page could not be loaded." onRetry={reset} />;
}
