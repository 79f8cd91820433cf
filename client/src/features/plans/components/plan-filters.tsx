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
const asOptions = (items: Option[]) => items.map((o) => ({ value: String(o.id), label: o.name }));

type ChoiceFilterProps = { label: string; anyLabel: string; value: string; options: { value: string; label: string }[]; onChange: (value: string) => void };

/** A labelled select whose empty choice means "no filter". */
function ChoiceFilter({ label, anyLabel, value, options, onChange }: ChoiceFilterProps) {
  return (
    <Field label={label}>
      {({ id }) => (
        <select id={id} className={selectClass} value={value} onChange={(e) => onChange(e.target.value)}>
          <option value="">{anyLabel}</option>
          {options.map((o) => (
            <option key={o.value} value={o.value}>{o.label}</option>
          ))}
        </select>
      )}
    </Field>
  );
}

/** State, owner, model and free text; every change lands in the URL through `onChange`. */
export function PlanFilters({ params, onChange, models, owners }: PlanFiltersProps) {
  const [text, setText] = useDebouncedText(params.q ?? "", (q) => onChange({ q }));

  const filtered = params.state || params.ownerId || params.modelId || params.q;
  return (
    <form role="search" aria-label="Filter plans" className="grid gap-3 sm:grid-cols-2 lg:grid-cols-[2fr_1fr_1fr_1fr_auto] lg:items-end" onSubmit={(e) => e.preventDefault()}>
      <Field label="Search plans">
        {({ id }) => <TextInput id={id} type="search" placeholder="Title, purpose, model or owner" value={text} onChange={(e) => setText(e.target.value)} />}
      </Field>
      <ChoiceFilter
        label="State"
        anyLabel="Any state"
        value={params.state ?? ""}
        options={REVISION_STATES.map((st) => ({ value: st, label: STATE_LABELS[st] }))}
        onChange={(v) => onChange({ state: (v || undefined) as RevisionState | undefined })}
      />
      <ChoiceFilter label="Owner" anyLabel="Anyone" value={String(params.ownerId ?? "")} options={asOptions(owners)} onChange={(v) => onChange({ ownerId: numberOrUndefined(v) })} />
      <ChoiceFilter label="Model" anyLabel="Any model" value={String(params.modelId ?? "")} options={asOptions(models)} onChange={(v) => onChange({ modelId: numberOrUndefined(v) })} />
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
