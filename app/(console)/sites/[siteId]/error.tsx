"use client";

import { ErrorPanel } from "@/components/ui/error-panel";

export default function SiteError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <ErrorPanel title="This site could not be loaded." onRetry={reset} />;
}
