"use client";

import { ErrorPanel } from "@/components/ui/error-panel";

export default function SitesError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <ErrorPanel title="The sites could not be loaded." onRetry={reset} />;
}
