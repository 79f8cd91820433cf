import { REVISION_STATES, type RevisionState } from "../../../../../shared/schemas/plans";
import { Field, TextInput } from "../../../components/field";
import { Button } from "../../../components/button";
import { useDebouncedText } from "../../../lib/search-state";
import type { PlanListParams } from "../api/list-plans";
import { STATE_LABELS } from "./state-badge";

type Option = { id: number; name: string };
type PlanFiltersProps = {
  params: PlanListParams;
  onChange: (changes: PlanListParams) => void;
  models: Option[];
  owners: Option[];
};

export const selectClass =
  "w-full rounded-md border border-rule-strong bg-white/70 px-3 py-2 text-body text-ink focus:border-seaglass focus:outline-2 focus:outline-seaglass/30 aria-[invalid=true]:border-signal";

const numberOrUndefined = (v: string) => (v === "" ? undefined : Number(v));

/** State, owner, model and free text; every change lands in the URL through `onChange`. */
export function PlanFilters({ params, onChange, models, owners }: PlanFiltersProps) {
  const [text, setText] = useDebouncedText(params.q ?? "", (q) => onChange({ q }));

  const filtered = params.state || params.ownerId || params.modelId || params.q;
  return (
    <form role="search" aria-label="Filter plans" className="grid gap-3 sm:grid-cols-2 lg:grid-cols-[2fr_1fr_1fr_1fr_auto] lg:items-end" onSubmit={(e) => e.preventDefault()}>
      <Field label="Search plans">
        {({ id }) => <TextInput id={id} type="search" placeholder="Title, purpose, model or owner" value={text} onChange={(e) => setText(e.target.value)} />}
      </Field>
      <Field label="State">
        {({ id }) => (
          <select id={id} className={selectClass} value={params.state ?? ""} onChange={(e) => onChange({ state: (e.target.value || undefined) as RevisionState | undefined })}>
            <option value="">Any state</option>
            {REVISION_STATES.map((s) => (
              <option key={s} value={s}>
                {STATE_LABELS[s]}
              </option>
            ))}
          </select>
        )}
      </Field>
      <Field label="Owner">
        {({ id }) => (
          <select id={id} className={selectClass} value={params.ownerId ?? ""} onChange={(e) => onChange({ ownerId: numberOrUndefined(e.target.value) })}>
            <option value="">Anyone</option>
            {owners.map((o) => (
              <option key={o.id} value={o.id}>
                {o.name}
              </option>
            ))}
          </select>
        )}
      </Field>
      <Field label="Model">
        {({ id }) => (
          <select id={id} className={selectClass} value={params.modelId ?? ""} onChange={(e) => onChange({ modelId: numberOrUndefined(e.target.value) })}>
            <option value="">Any model</option>
            {models.map((m) => (
              <option key={m.id} value={m.id}>
                {m.name}
              </option>
            ))}
          </select>
        )}
      </Field>
      <div className="pb-0.5">
        <Button
          variant="quiet"
          disabled={!filtered}
          onClick={() => {
            setText("");
            onChange({ state: undefined, ownerId: undefined, modelId: undefined, q: undefined });
          }}
        >
          Clear filters
        </Button>
      </div>
    </form>
  );
}
