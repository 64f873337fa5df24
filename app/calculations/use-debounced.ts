// A value that follows another after it has stopped changing for `ms`: live results recompute as you pause.
import { useEffect, useState } from "react";

export function useDebounced<T>(value: T, ms = 200): T {
  const [current, setCurrent] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setCurrent(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return current;
}
