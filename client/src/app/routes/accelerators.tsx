import { Page } from "@/components/page";
import { ManageAccelerators } from "@/features/accelerators/components/manage-accelerators";
import { useCurrentUser } from "@/features/auth/hooks/use-session";

/** Who may change the catalog; the server enforces the same rule on every write. */
const KEEPERS = ["infra", "admin"] as const;

export function AcceleratorsRoute() {
  const user = useCurrentUser();
  const canEdit = user.roles.some((r) => (KEEPERS as readonly string[]).includes(r));
  return (
    <Page
      title="Accelerators"
      lead={
        <>
          The hardware a budget can be costed on: memory, dense peak FLOP/s at the training precision, and price per
          hour.
          {canEdit
            ? " Changes apply to drafts from their next edit; submitted plans keep the figures they were costed with."
            : " Infra leads and admins keep this list."}
        </>
      }
    >
      <ManageAccelerators canEdit={canEdit} />
    </Page>
  );
}
