import { useEffect, useState } from "react";

/**
 * `value`, once it has stopped changing for `ms` milliseconds, so typing a number does not fire a request per key.
 * Compared by JSON, so a fresh but equal object does not restart the wait. With `holdWhileNull`, a moment with no
 * valid value (an empty box) keeps the last good value instead of settling on null.
 */
export function useDebounced<T>(value: T, ms: number, { holdWhileNull = false }: { holdWhileNull?: boolean } = {}): T {
  const [settled, setSettled] = useState(value);
  const json = JSON.stringify(value) ?? "null";
  useEffect(() => {
    if (holdWhileNull && json === "null") return;
    const timer = setTimeout(() => setSettled(JSON.parse(json) as T), ms);
    return () => clearTimeout(timer);
  }, [json, ms, holdWhileNull]);
  return settled;
}
