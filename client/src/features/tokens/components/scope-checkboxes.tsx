import { TOKEN_SCOPES, TOKEN_SCOPE_LABELS, type TokenScope } from "@shared/schemas/tokens";
import { Checkbox } from "@/components/field";

/**
 * One checkbox per token scope. Controlled (value is always a TokenScope[]): react-hook-form turns a lone registered
 * checkbox into a string or boolean, and there is a single scope today.
 */
export function ScopeCheckboxes({
  value,
  onChange,
  error,
}: {
  value: TokenScope[];
  onChange: (v: TokenScope[]) => void;
  error?: string;
}) {
  return (
    <fieldset className="flex flex-col gap-2" aria-invalid={Boolean(error)}>
      <legend className="mb-1 text-note font-semibold text-ink">Scopes</legend>
      <div className="flex flex-wrap gap-x-5 gap-y-2">
        {TOKEN_SCOPES.map((scope) => (
          <Checkbox
            key={scope}
            name="scopes"
            value={scope}
            checked={value.includes(scope)}
            onChange={(e) => onChange(e.target.checked ? [...value, scope] : value.filter((s) => s !== scope))}
            label={
              <span>
                <code>{scope}</code> <span className="text-note text-ink-soft">— {TOKEN_SCOPE_LABELS[scope]}</span>
              </span>
            }
          />
        ))}
      </div>
      {error && (
        <p className="text-note text-signal" role="alert">
          {error}
        </p>
      )}
    </fieldset>
  );
}
