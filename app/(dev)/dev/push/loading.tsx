import { LoadingPanel } from "@/components/ui/loading-panel";

export default function Loading() {
  return <LoadingPanel label="Loading pushed messages…" />;
}
