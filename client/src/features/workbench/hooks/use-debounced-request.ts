import { useEffect, useState } from "react";

/**
 * The latest valid value, settled for `ms` milliseconds: typing a number does not fire a request per key,
 * and an invalid moment (an empty box) keeps the last good value on screen.
 */
export function useSettledValue<T>(value: T | null, ms = 300): T | null {
  const [settled, setSettled] = useState<T | null>(value);
  const key = JSON.stringify(value);
  useEffect(() => {
    if (value === null) return;
    const timer = setTimeout(() => setSettled(value), ms);
    return () => clearTimeout(timer);
    // The key stands for the value: a fresh object with the same content must not restart the timer.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [key, ms]);
  return settled;
}
