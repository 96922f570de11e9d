"use client";

import { ErrorPanel } from "@/components/ui/error-panel";

export default function GatewayKeysError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <ErrorPanel title="The gateway keys could not be loaded." onRetry={reset} />;
}
