// Re-reads the route's loader every few seconds while something is still happening on the server.
import { useEffect } from "react";
import { useRevalidator } from "react-router";

export function usePollWhile(active: boolean, everyMs = 1500) {
  const revalidator = useRevalidator();
  useEffect(() => {
    if (!active) return;
    const t = setInterval(() => revalidator.state === "idle" && revalidator.revalidate(), everyMs);
    return () => clearInterval(t);
  }, [active, everyMs, revalidator]);
}
