import type { Explanation } from "@/lib/energy/types";
import { sig } from "./format";

/** Every computed number with its formula and inputs, so a verdict can be traced and defended. */
export function ExplanationList({ explanations }: { explanations: Explanation[] }) {
  return (
    <section aria-labelledby="how-worked-out" className="space-y-3">
      <h2 id="how-worked-out" className="text-lg font-bold">How each number is worked out</h2>
      <div className="grid gap-3 lg:grid-cols-2">
        {explanations.map((e) => (
          <article key={e.id} aria-label={e.label} className="rounded-xl border border-line bg-paper p-3 text-sm">
            <h3 className="font-bold">
              {e.label}: <span className="tabular-nums">{sig(e.value)} {e.unit}</span>
            </h3>
            <p className="mt-1">
              <code className="rounded bg-fog px-1 py-0.5 text-xs">{e.formula}</code>
            </p>
            {e.inputs.length ? (
              <table className="mt-2 w-full text-xs">
                <caption className="sr-only">Inputs of {e.label}</caption>
                <tbody>
                  {e.inputs.map((i, n) => (
                    <tr key={`${i.label}-${n}`} className="border-t border-line/60 align-top">
                      <th scope="row" className="py-1 pr-2 text-left font-semibold">{i.label}</th>
                      <td className="py-1 pr-2 tabular-nums">
                        {typeof i.value === "number" ? sig(i.value, 4) : i.value} {i.unit ?? ""}
                      </td>
                      <td className="py-1 text-slate">{i.source ?? ""}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            ) : null}
            {e.note ? <p className="mt-2 text-xs text-slate">{e.note}</p> : null}
          </article>
        ))}
      </div>
    </section>
  );
}
