import { Page, Panel } from "@/components/page";
import { Chip } from "@/components/notice";
import { roleLabel } from "@/lib/format";
import { ChangePasswordForm } from "@/features/auth/components/change-password-form";
import { useCurrentUser } from "@/features/auth/hooks/use-session";
import { TokenManager } from "@/features/tokens/components/token-manager";
import { TokenUsage } from "@/features/tokens/components/token-usage";

export function ProfileRoute() {
  const user = useCurrentUser();
  return (
    <Page title="Profile" lead="Your account. An admin changes names and roles; you change your own password.">
      <Panel title="Account">
        <dl className="grid max-w-lg grid-cols-[8rem_1fr] gap-y-2 text-body">
          <dt className="text-ink-soft">Name</dt>
          <dd>{user.name}</dd>
          <dt className="text-ink-soft">E-mail</dt>
          <dd>{user.email}</dd>
          <dt className="text-ink-soft">Roles</dt>
          <dd className="flex flex-wrap gap-1">
            {user.roles.map((r) => (
              <Chip key={r}>{roleLabel(r)}</Chip>
            ))}
          </dd>
        </dl>
      </Panel>
      <Panel title="Change password">
        <ChangePasswordForm />
      </Panel>
      <Panel title="API tokens">
        <p className="mb-3 max-w-prose text-body text-ink-soft">
          Read-only tokens for scripts, such as a training job fetching the signed configuration patch. They act as you,
          and can only read.
        </p>
        <TokenManager />
        <div className="mt-6">
          <TokenUsage />
        </div>
      </Panel>
    </Page>
  );
}
