import { useEffect, useRef } from "react";
import { useBlocker } from "react-router-dom";
import { Button } from "./button";

/**
 * Holds a page with unsaved edits: a move inside the app (a link, the back button) asks first, in a modal dialog
 * where the person is looking; closing or reloading the tab gets the browser's own "leave site?" question
 * (beforeunload: browsers show their own wording, never ours).
 */
export function LeaveGuard({ when, what }: { when: boolean; what: string }) {
  const blocker = useBlocker(
    ({ currentLocation, nextLocation }) => when && currentLocation.pathname !== nextLocation.pathname,
  );
  const ref = useRef<HTMLDialogElement>(null);

  useEffect(() => {
    if (!when) return;
    const hold = (e: BeforeUnloadEvent) => {
      e.preventDefault();
      // Older Chromium builds still read returnValue.
      e.returnValue = "";
    };
    window.addEventListener("beforeunload", hold);
    return () => window.removeEventListener("beforeunload", hold);
  }, [when]);

  useEffect(() => {
    const dialog = ref.current;
    if (blocker.state === "blocked" && dialog && !dialog.open) dialog.showModal();
  }, [blocker.state]);

  if (blocker.state !== "blocked") return null;
  return (
    <dialog
      ref={ref}
      onCancel={() => blocker.reset()}
      aria-labelledby="leave-guard-title"
      className="m-auto w-[min(32rem,calc(100vw-2rem))] rounded-lg border border-rule bg-paper p-6 text-ink shadow-xl backdrop:bg-ink/40"
    >
      <h2 id="leave-guard-title" className="text-title font-semibold">
        Leave with unsaved changes?
      </h2>
      <p className="mt-2 text-body">{what} has changes that are not saved. Leaving now discards them.</p>
      <div className="mt-4 flex flex-wrap gap-2">
        <Button autoFocus onClick={() => blocker.reset()}>
          Stay and keep editing
        </Button>
        <Button variant="danger" onClick={() => blocker.proceed()}>
          Leave and discard
        </Button>
      </div>
    </dialog>
  );
}
