"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";

export function SignOutButton({ everywhere = false, className }: { everywhere?: boolean; className?: string }) {
  const router = useRouter();
  const [isPending, setPending] = useState(false);
  const [error, setError] = useState<string | null>(null);
  return (
    <>
      <button
        type="button"
        disabled={isPending}
        className={className ?? "rounded-md px-3 py-1.5 text-sm font-semibold text-slate hover:bg-fog hover:text-ink"}
        onClick={async () => {
          setPending(true);
          const res = await fetch(everywhere ? "/api/auth/sign-out-everywhere" : "/api/auth/sign-out", { method: "POST" }).catch(() => null);
          if (!res?.ok) {
            setPending(false);
            setError("Could not sign out. Try again.");
            return;
          }
          router.replace("/sign-in");
          router.refresh();
        }}
      >
        {isPending ? "Signing out…" : everywhere ? "Sign out everywhere" : "Sign out"}
      </button>
      {error ? (
        <span role="alert" className="text-sm text-clay">
          {error}
        </span>
      ) : null}
    </>
  );
}
