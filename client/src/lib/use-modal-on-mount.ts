import { useEffect, type RefObject } from "react";

/**
 * Opens a <dialog> as a modal once it is mounted. Removing the element on unmount ends the modal state; closing it in a
 * cleanup would fire onClose during StrictMode's re-run, so there is none.
 */
export function useModalOnMount(ref: RefObject<HTMLDialogElement | null>) {
  useEffect(() => {
    const dialog = ref.current;
    if (dialog && !dialog.open) dialog.showModal();
  }, [ref]);
}
