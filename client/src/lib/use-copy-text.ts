import { useState } from "react";

/** Copy text to the clipboard and remember how it went, for a "Copied" / "select it by hand" line. */
export function useCopyText() {
  const [copied, setCopied] = useState<"yes" | "failed" | null>(null);
  const copy = async (text: string) => {
    try {
      await navigator.clipboard.writeText(text);
      setCopied("yes");
    } catch {
      setCopied("failed");
    }
  };
  return { copied, copy };
}
