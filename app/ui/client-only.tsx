// Renders its children only in the browser, after hydration (the PDF viewer cannot load on the server).
import { useSyncExternalStore, type ReactNode } from "react";

const subscribe = () => () => {};

export function useHydrated() {
  return useSyncExternalStore(subscribe, () => true, () => false);
}

export function ClientOnly({ children, fallback = null }: { children: () => ReactNode; fallback?: ReactNode }) {
  return useHydrated() ? <>{children()}</> : <>{fallback}</>;
}
