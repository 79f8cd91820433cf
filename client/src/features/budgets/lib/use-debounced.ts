import { useEffect, useState } from "react";

/** `value`, once it has stopped changing for `ms` milliseconds. Compared by JSON so a fresh but equal object does not restart the wait. */
export function useDebounced<T>(value: T, ms: number): T {
  const [settled, setSettled] = useState(value);
  const json = JSON.stringify(value);
  useEffect(() => {
    const timer = setTimeout(() => setSettled(JSON.parse(json) as T), ms);
    return () => clearTimeout(timer);
  }, [json, ms]);
  return settled;
}
