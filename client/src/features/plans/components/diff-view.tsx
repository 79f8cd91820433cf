import type { DiffResponse, FieldChange } from "@shared/schemas/plans";
import { formatMoney, formatHours, shortHash } from "@/lib/format";
import { FramedTable } from "@/components/framed-table";
import { formatPairRanges } from "../lib/pair-ranges";
import { fieldDelta, showValue } from "../lib/field-delta";
import { FLAG_INFO } from "./flags-summary";

/** Changed fields as a was / now table with the figure's change beside it; neither side is struck out or coloured. */
function ChangesTable({ changes, caption }: { changes: FieldChange[]; caption: string }) {
  return (
    <FramedTable
      caption={caption}
      head={
        <>
          <th scope="col">Field</th>
          <th scope="col">Was</th>
          <th scope="col">Now</th>
          <th scope="col">Change</th>
        </>
      }
    >
      {changes.map((c) => (
        <tr key={c.path} className="border-t border-rule/70 align-top">
          <th scope="row" className="px-3 py-2 font-mono text-note font-medium break-all">
            {c.path}
          </th>
          <td className="px-3 py-2 break-all text-ink-soft">{showValue(c.from)}</td>
          <td className="px-3 py-2 font-medium break-all">{showValue(c.to)}</td>
          <td className="px-3 py-2 text-note whitespace-nowrap text-ink-soft">{fieldDelta(c.from, c.to)}</td>
        </tr>
      ))}
    </FramedTable>
  );
}

const signed = (n: number, fmt: (v: number) => string) => `${n > 0 ? "+" : n < 0 ? "−" : "±"}${fmt(Math.abs(n))}`;
const money = (v: number | null, currency?: string) => (v === null ? "—" : formatMoney(v, currency));

/** Revision a beside revision b: inputs, stages by position, pairs whose flags flipped, and what the budget moved. */
export function DiffView({ diff }: { diff: DiffResponse }) {
  // Each side in the workspace currency it was costed in (frozen with the revision; null before the setting existed).
  const was = diff.budget.totals?.currencyFrom ?? undefined;
  const now = diff.budget.totals?.currencyTo ?? was;
  const delta = (v: number) => formatMoney(v, now);
  const flagGroups = new Map<string, DiffResponse["flags"]>();
  for (const f of diff.flags) {
    const key = `${f.scope}|${f.flag}|${f.to}`;
    flagGroups.set(key, [...(flagGroups.get(key) ?? []), f]);
  }
  return (
    <div className="flex flex-col gap-6">
      <p className="text-body">
        Was: revision {diff.a.number} (<code title={diff.a.contentHash}>{shortHash(diff.a.contentHash)}</code>). Now:
        revision {diff.b.number} (<code title={diff.b.contentHash}>{shortHash(diff.b.contentHash)}</code>).
      </p>
      <section className="flex flex-col gap-2" aria-label="Changed fields">
        <h2 className="text-title font-semibold">Inputs</h2>
        {diff.fields.length ? (
          <ChangesTable changes={diff.fields} caption="Changed inputs" />
        ) : (
          <p className="text-body text-ink-soft">No input changed.</p>
        )}
      </section>
      <section className="flex flex-col gap-2" aria-label="Changed stages">
        <h2 className="text-title font-semibold">Stages</h2>
        {diff.stages.length === 0 && <p className="text-body text-ink-soft">No stage changed.</p>}
        {diff.stages.map((s) => (
          <div key={s.index} className="flex flex-col gap-1">
            <h3 className="font-semibold">
              Stage {s.index + 1}:{" "}
              {s.change === "added"
                ? "added"
                : s.change === "removed"
                  ? "removed"
                  : `${s.fields.length} field${s.fields.length === 1 ? "" : "s"} changed`}
            </h3>
            {s.fields.length > 0 && <ChangesTable changes={s.fields} caption={`Stage ${s.index + 1} changes`} />}
          </div>
        ))}
      </section>
      <section className="flex flex-col gap-2" aria-label="Changed flags">
        <h2 className="text-title font-semibold">Pairs whose flags changed</h2>
        {diff.flags.length === 0 && <p className="text-body text-ink-soft">Every pair keeps its flags.</p>}
        <ul className="flex flex-col gap-1 text-body">
          {[...flagGroups.entries()].map(([key, items]) => {
            const { scope, flag, to } = items[0];
            const label = FLAG_INFO[flag as keyof typeof FLAG_INFO]?.label ?? flag;
            return (
              <li key={key}>
                <span className="font-medium">
                  {scope === "final" ? "Plan target" : `Stage ${Number(scope.split(".")[1]) + 1}`}
                </span>
                : {label} <span className="font-semibold">{to ? "was clear, now set" : "was set, now clear"}</span> on
                pairs {formatPairRanges(items.map((i) => i.pair))}
              </li>
            );
          })}
        </ul>
      </section>
      <section className="flex flex-col gap-2" aria-label="Budget changes">
        <h2 className="text-title font-semibold">Budget</h2>
        {diff.budget.inputs.length > 0 && <ChangesTable changes={diff.budget.inputs} caption="Budget input changes" />}
        {diff.budget.totals ? (
          <FramedTable
            caption="Budget figures, was and now"
            head={
              <>
                <th scope="col">Figure</th>
                <th scope="col">Was</th>
                <th scope="col">Now</th>
                <th scope="col">Change</th>
              </>
            }
            foot={
              <tr>
                <th scope="row" className="px-3 py-2 text-left">
                  Total cost
                </th>
                <td className="px-3 py-2">{money(diff.budget.totals.costFrom, was)}</td>
                <td className="px-3 py-2">{money(diff.budget.totals.costTo, now)}</td>
                <td className="px-3 py-2 whitespace-nowrap">{signed(diff.budget.totals.costDelta, delta)}</td>
              </tr>
            }
          >
            {diff.budget.stages.map((s) => (
              <tr key={s.index} className="border-t border-rule/70 align-top">
                <th scope="row" className="px-3 py-2 text-left font-medium">
                  Stage {s.index + 1} cost
                </th>
                <td className="px-3 py-2 text-ink-soft">{money(s.costFrom, was)}</td>
                <td className="px-3 py-2 font-medium">{money(s.costTo, now)}</td>
                <td className="px-3 py-2 text-note whitespace-nowrap text-ink-soft">
                  {signed(s.costDelta, delta)}; accelerator-hours {signed(s.hoursDelta, formatHours)}
                </td>
              </tr>
            ))}
          </FramedTable>
        ) : (
          <p className="text-body text-ink-soft">One or both revisions have no costed budget sheet.</p>
        )}
        {diff.budget.totals && (
          <p className="text-note text-ink-soft">
            {was && now && was !== now
              ? `Costs in the currency each revision was costed in (${was}, then ${now}); estimates.`
              : "Costs in the workspace currency the revisions were costed in; estimates."}
          </p>
        )}
      </section>
    </div>
  );
}
