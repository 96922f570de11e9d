"use client";

import { ErrorPanel } from "@/components/ui/error-panel";

export default function MembersError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <ErrorPanel title="The members could not be loaded." onRetry={reset} />;
}
