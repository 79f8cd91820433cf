import { REVISION_STATES, type RevisionState } from "@shared/schemas/plans";
import { PROOF_LABELS } from "@shared/schemas/evidence-api";
import { PROOF_NONE_LABEL } from "@/components/proof-badge";
import { ChoiceField, Field, TextInput } from "@/components/field";
import { Button } from "@/components/button";
import { useDebouncedText } from "@/lib/search-state";
import type { PlanListParams } from "../api/list-plans";
import { STATE_LABELS } from "./state-badge";

type Option = { id: number; name: string };
type PlanFiltersProps = {
  params: PlanListParams;
  onChange: (changes: PlanListParams) => void;
  models: Option[];
  owners: Option[];
};

const numberOrUndefined = (v: string) => (v === "" ? undefined : Number(v));
const asOptions = (items: Option[]) => items.map((o) => ({ value: String(o.id), label: o.name }));

/** State, owner, model and free text; every change lands in the URL through `onChange`. */
export function PlanFilters({ params, onChange, models, owners }: PlanFiltersProps) {
  const [text, setText] = useDebouncedText(params.q ?? "", (q) => onChange({ q }));

  const filtered = params.state || params.proof || params.ownerId || params.modelId || params.q;
  return (
    <form
      role="search"
      aria-label="Filter plans"
      className="grid gap-3 sm:grid-cols-2 lg:grid-cols-[2fr_1fr_1fr_1fr_1fr_auto] lg:items-end"
      onSubmit={(e) => e.preventDefault()}
    >
      <Field label="Search plans">
        {({ id }) => (
          <TextInput
            id={id}
            type="search"
            placeholder="Title, purpose, model or owner"
            value={text}
            onChange={(e) => setText(e.target.value)}
          />
        )}
      </Field>
      <ChoiceField
        label="State"
        emptyLabel="Any state"
        value={params.state ?? ""}
        options={REVISION_STATES.map((st) => ({ value: st, label: STATE_LABELS[st] }))}
        onChange={(v) => onChange({ state: (v || undefined) as RevisionState | undefined })}
      />
      <ChoiceField
        label="Proof"
        emptyLabel="Any proof"
        value={params.proof ?? ""}
        options={[
          { value: "proven", label: PROOF_LABELS.proven },
          { value: "unproven", label: PROOF_LABELS.unproven },
          { value: "none", label: `${PROOF_NONE_LABEL} (approved)` },
        ]}
        onChange={(v) => onChange({ proof: (v || undefined) as PlanListParams["proof"] })}
      />
      <ChoiceField
        label="Owner"
        emptyLabel="Anyone"
        value={String(params.ownerId ?? "")}
        options={asOptions(owners)}
        onChange={(v) => onChange({ ownerId: numberOrUndefined(v) })}
      />
      <ChoiceField
        label="Model"
        emptyLabel="Any model"
        value={String(params.modelId ?? "")}
        options={asOptions(models)}
        onChange={(v) => onChange({ modelId: numberOrUndefined(v) })}
      />
      <div className="pb-0.5">
        <Button
          variant="quiet"
          disabled={!filtered}
          onClick={() => {
            setText("");
            onChange({ state: undefined, proof: undefined, ownerId: undefined, modelId: undefined, q: undefined });
          }}
        >
          Clear filters
        </Button>
      </div>
    </form>
  );
}
