import { Button } from "@/components/button";
import { TextField } from "@/components/field";
import { useDebouncedText } from "@/lib/search-state";
import type { AuditParams } from "../api/list-audit";

/** yyyy-mm-dd of a stored ISO bound, in local time, for a date input. */
const dayOf = (iso?: string) => {
  if (!iso) return "";
  const d = new Date(iso);
  return Number.isNaN(d.getTime())
    ? ""
    : `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, "0")}-${String(d.getDate()).padStart(2, "0")}`;
};
/** A local day's first or last instant as an ISO timestamp (the API wants an offset). */
const boundOf = (day: string, end: boolean) =>
  day ? new Date(`${day}T${end ? "23:59:59.999" : "00:00:00"}`).toISOString() : undefined;

function Debounced({
  label,
  placeholder,
  value,
  onChange,
}: {
  label: string;
  placeholder?: string;
  value: string;
  onChange: (v: string | undefined) => void;
}) {
  const [text, setText] = useDebouncedText(value, onChange);
  return <TextField label={label} placeholder={placeholder} value={text} onChange={(e) => setText(e.target.value)} />;
}

/** Action prefix, subject and day range; each change lands in the URL. */
export function AuditFilters({ params, onChange }: { params: AuditParams; onChange: (changes: AuditParams) => void }) {
  const any = params.action || params.subjectType || params.subjectId || params.from || params.to || params.actorId;
  return (
    <form
      role="search"
      aria-label="Filter the audit trail"
      onSubmit={(e) => e.preventDefault()}
      className="grid gap-3 sm:grid-cols-2 lg:grid-cols-[1.5fr_1fr_1fr_1fr_1fr_auto] lg:items-end"
    >
      <Debounced
        label="Action starts with"
        placeholder="decision. or revision.approved"
        value={params.action ?? ""}
        onChange={(v) => onChange({ action: v })}
      />
      <Debounced
        label="Subject type"
        placeholder="plan, token, user…"
        value={params.subjectType ?? ""}
        onChange={(v) => onChange({ subjectType: v })}
      />
      <Debounced
        label="Subject id"
        placeholder="e.g. a plan number"
        value={params.subjectId ?? ""}
        onChange={(v) => onChange({ subjectId: v })}
      />
      <TextField
        label="From day"
        type="date"
        value={dayOf(params.from)}
        onChange={(e) => onChange({ from: boundOf(e.target.value, false) })}
      />
      <TextField
        label="To day"
        type="date"
        value={dayOf(params.to)}
        onChange={(e) => onChange({ to: boundOf(e.target.value, true) })}
      />
      <div className="pb-0.5">
        <Button
          variant="quiet"
          disabled={!any}
          onClick={() =>
            onChange({
              action: undefined,
              subjectType: undefined,
              subjectId: undefined,
              from: undefined,
              to: undefined,
              actorId: undefined,
            })
          }
        >
          Clear filters
        </Button>
      </div>
    </form>
  );
}
