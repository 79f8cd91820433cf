import { useState } from "react";
import type { ModelProfile } from "../../../../../shared/schemas/models";
import { Button } from "../../../components/button";
import { Notice } from "../../../components/notice";
import { isApiError } from "../../../lib/api-client";
import { useDeleteModel } from "../api/delete-model";

/** Delete after a second click; a profile that plans still use is refused and the plans are named. */
export function DeleteProfile({ model, onDeleted }: { model: ModelProfile; onDeleted: () => void }) {
  const remove = useDeleteModel();
  const [confirming, setConfirming] = useState(false);
  const inUse = isApiError(remove.error) && remove.error.status === 409;

  return (
    <div className="flex flex-col gap-3">
      {remove.isError && (
        <Notice tone="alert" title={inUse ? "This profile is still in use" : "Could not delete the profile"}>
          {inUse ? (
            <>
              <p>The server refused: {remove.error.message}.</p>
              <p className="mt-1">Plans keep the profile they were drafted on. Delete or move those plans first, or keep the profile.</p>
            </>
          ) : (
            remove.error.message
          )}
        </Notice>
      )}
      {confirming ? (
        <div className="flex flex-wrap items-center gap-2" role="group" aria-label="Confirm deletion">
          <span className="text-body">Delete {model.name}? This cannot be undone.</span>
          <Button
            variant="danger"
            size="sm"
            busy={remove.isPending}
            onClick={() => remove.mutate(model.id, { onSuccess: onDeleted, onSettled: () => setConfirming(false) })}
          >
            Yes, delete it
          </Button>
          <Button variant="secondary" size="sm" onClick={() => setConfirming(false)}>
            Keep it
          </Button>
        </div>
      ) : (
        <div>
          <Button variant="danger" onClick={() => { remove.reset(); setConfirming(true); }}>
            Delete profile
          </Button>
        </div>
      )}
    </div>
  );
}
