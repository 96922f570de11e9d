"use client";

import { useQuery } from "@tanstack/react-query";
import { useState } from "react";
import { fetchJson } from "@/components/api/fetch-json";
import { ErrorPanel } from "@/components/ui/error-panel";
import { LoadingPanel } from "@/components/ui/loading-panel";
import { CreateKeyForm } from "./create-key-form";
import { GatewayHowTo, type ExampleDevice } from "./gateway-how-to";
import type { KeyCreatedResponse, KeysResponse } from "@/lib/validation/keys";
import { KeysTable } from "./keys-table";
import { NewKeyBox } from "./new-key-box";

export type { ExampleDevice };

export function keysKey(siteId: string) {
  return ["sites", siteId, "keys"] as const;
}

export function GatewayKeysPanel({ siteId, fallbackOrigin, example }: { siteId: string; fallbackOrigin: string; example: ExampleDevice | null }) {
  const query = useQuery({ queryKey: keysKey(siteId), queryFn: () => fetchJson<KeysResponse>(`/api/sites/${encodeURIComponent(siteId)}/keys`) });
  // The new key lives only in this component's memory: it is gone on reload, as promised.
  const [created, setCreated] = useState<KeyCreatedResponse | null>(null);

  if (query.isPending) return <LoadingPanel label="Loading gateway keys…" />;
  if (query.isError) return <ErrorPanel title="The gateway keys could not be loaded." detail={query.error.message} onRetry={() => void query.refetch()} />;

  return (
    <div className="space-y-10">
      <section aria-labelledby="keys-title">
        <h1 id="keys-title" className="text-2xl font-extrabold">
          Gateway keys
        </h1>
        <p className="mt-1 max-w-3xl text-slate">
          A site&apos;s gateway sends what its switches and sensors report with one of these keys, and collects the mesh messages the active Rule set sends back. Give each gateway its own key so you can revoke one without stopping the others.
        </p>
        {created ? <NewKeyBox created={created} onDone={() => setCreated(null)} /> : null}
        <KeysTable siteId={siteId} keys={query.data.keys} />
      </section>
      <section aria-labelledby="create-key-title" className="max-w-xl">
        <h2 id="create-key-title" className="text-xl font-bold">
          Create a key
        </h2>
        <p className="mt-1 text-sm text-slate">The key is shown once, right after you create it. Joulepath keeps only a fingerprint of it.</p>
        <div className="mt-4 rounded-2xl border border-line bg-paper p-5">
          <CreateKeyForm siteId={siteId} onCreated={setCreated} />
        </div>
      </section>
      <GatewayHowTo siteId={siteId} fallbackOrigin={fallbackOrigin} example={example} />
    </div>
  );
}
