import { notFound } from "next/navigation";
import { env } from "@/lib/env";

/**
 * Gate for every developer-only page. It sits in a layout, outside the pages'
 * loading boundaries, so a disabled tool answers a real 404 rather than a
 * streamed 200 (see "Conventions" in DEVELOPERS.md).
 */
export default function DevToolsLayout({ children }: { children: React.ReactNode }) {
  if (env().JOULEPATH_DEV_TOOLS !== "1") notFound();
  return children;
}
