import { TOKEN_SCOPES, TOKEN_SCOPE_LABELS, type TokenScope } from "@shared/schemas/tokens";
import { CheckboxGroup } from "@/components/checkbox-group";

/** One checkbox per token scope, with the scope's plain-language line. */
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
    <CheckboxGroup
      legend="Scopes"
      name="scopes"
      options={TOKEN_SCOPES}
      value={value}
      onChange={onChange}
      error={error}
      label={(scope) => (
        <span>
          <code>{scope}</code> <span className="text-note text-ink-soft">— {TOKEN_SCOPE_LABELS[scope]}</span>
        </span>
      )}
    />
  );
}
