"use client";

import { useQuery } from "@tanstack/react-query";
import { useId, useState } from "react";
import { useForm } from "react-hook-form";
import { fetchJson } from "@/components/api/fetch-json";
import { FormError, SubmitButton } from "@/components/forms/submit-button";
import { submitJson } from "@/components/forms/submit-json";
import { KIND_LABEL } from "@/lib/notices/message";
import { ALWAYS_DELIVERED_KINDS, type NoticePrefs } from "@/lib/notices/preferences";
import { NOTICE_CHANNELS } from "@/lib/rules/graph-actions";
import { NOTICE_KINDS } from "@/lib/rules/notice-kind";

type Values = { kinds: string[]; channels: string[]; quietFrom: string; quietTo: string; _?: never };
const CHANNEL_LABEL: Record<string, string> = { push: "Push (this and other browsers)", "in-app": "Inbox in the console", email: "E-mail" };

/** One site's notice preferences for the signed-in person. */
export function NoticePrefsForm({ siteId, siteName }: { siteId: string; siteName: string }) {
  const url = `/api/notices/sites/${siteId}/preferences`;
  const query = useQuery({ queryKey: ["notices", "prefs", siteId], queryFn: () => fetchJson<{ prefs: NoticePrefs }>(url) });
  if (query.isPending) return <p className="text-sm text-slate">Loading {siteName}…</p>;
  if (query.isError) return <p role="alert" className="text-sm font-semibold text-clay">Could not load the settings for {siteName}: {query.error.message}</p>;
  return <PrefsForm url={url} siteName={siteName} prefs={query.data.prefs} />;
}

function PrefsForm({ url, siteName, prefs }: { url: string; siteName: string; prefs: NoticePrefs }) {
  const id = useId();
  const [saved, setSaved] = useState(false);
  const form = useForm<Values>({
    defaultValues: { kinds: prefs.kinds ?? [...NOTICE_KINDS], channels: prefs.channels, quietFrom: prefs.quietFrom ?? "", quietTo: prefs.quietTo ?? "" },
  });
  const { errors, isSubmitting } = form.formState;
  const onSubmit = form.handleSubmit(async (v) => {
    setSaved(false);
    const kinds = NOTICE_KINDS.every((k) => v.kinds.includes(k) || ALWAYS_DELIVERED_KINDS.includes(k)) ? null : v.kinds;
    const ok = await submitJson(url, { kinds, channels: v.channels, quietFrom: v.quietFrom || null, quietTo: v.quietTo || null }, form.setError, "PUT");
    if (ok) setSaved(true);
  });
  const fieldError = (name: string) => (errors as Record<string, { message?: string } | undefined>)[name]?.message;
  return (
    <form onSubmit={onSubmit} noValidate aria-label={`Notices from ${siteName}`} className="space-y-4">
      <FormError message={errors.root?.server?.message} />
      <fieldset>
        <legend className="text-sm font-semibold">Which notices</legend>
        <div className="mt-1 grid grid-cols-2 gap-x-4 gap-y-1 sm:grid-cols-4">
          {NOTICE_KINDS.map((k) => {
            const isAlways = ALWAYS_DELIVERED_KINDS.includes(k);
            return (
              <label key={k} className="flex items-center gap-2 text-sm">
                {/* Always delivered: shown ticked, and kept out of the form so it cannot be turned off. */}
                {isAlways ? <input type="checkbox" checked disabled readOnly className="h-4 w-4 accent-ink" /> : <input type="checkbox" value={k} {...form.register("kinds")} className="h-4 w-4 accent-ink" />}
                {KIND_LABEL[k]}
                {isAlways ? <span className="text-xs text-slate">(always)</span> : null}
              </label>
            );
          })}
        </div>
        {fieldError("kinds") ? <p role="alert" className="mt-1 text-sm font-semibold text-clay">{fieldError("kinds")}</p> : null}
      </fieldset>
      <fieldset>
        <legend className="text-sm font-semibold">How</legend>
        <div className="mt-1 flex flex-wrap gap-x-5 gap-y-1">
          {NOTICE_CHANNELS.map((c) => (
            <label key={c} className="flex items-center gap-2 text-sm">
              <input type="checkbox" value={c} {...form.register("channels")} className="h-4 w-4 accent-ink" />
              {CHANNEL_LABEL[c]}
            </label>
          ))}
        </div>
        <p className="mt-1 text-xs text-slate">Emergency notices always reach your inbox, and push through quiet hours.</p>
      </fieldset>
      <fieldset>
        <legend className="text-sm font-semibold">Quiet hours (the site&apos;s time)</legend>
        <p className="text-xs text-slate">No push notices in this span; they still reach the inbox. Leave both empty for none.</p>
        <div className="mt-1 flex flex-wrap items-start gap-3">
          {(["quietFrom", "quietTo"] as const).map((name) => (
            <div key={name} className="flex flex-col gap-1">
              <label htmlFor={`${id}-${name}`} className="text-sm">
                {name === "quietFrom" ? "From" : "Until"}
              </label>
              <input
                id={`${id}-${name}`}
                type="time"
                {...form.register(name)}
                aria-invalid={fieldError(name) ? true : undefined}
                aria-describedby={fieldError(name) ? `${id}-${name}-error` : undefined}
                className={`rounded-md border bg-paper px-3 py-1.5 ${fieldError(name) ? "border-clay" : "border-line"}`}
              />
              {fieldError(name) ? (
                <p id={`${id}-${name}-error`} role="alert" className="text-sm font-semibold text-clay">
                  {fieldError(name)}
                </p>
              ) : null}
            </div>
          ))}
        </div>
      </fieldset>
      <div className="flex items-center gap-3">
        <SubmitButton isPending={isSubmitting} pendingText="Saving…">
          Save for {siteName}
        </SubmitButton>
        {saved ? (
          <p role="status" className="text-sm font-semibold text-moss">
            Saved.
          </p>
        ) : null}
      </div>
    </form>
  );
}
