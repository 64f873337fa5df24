// The project a request is about, and the caller's role on it, set by the project layout's middleware.
import { createContext } from "react-router";
import type { Role } from "./permissions";

export interface ProjectAccess {
  project: { id: string; name: string; siteAddress: string; clientName: string | null; description: string | null };
  role: Role;
}

export const projectContext = createContext<ProjectAccess | null>(null);
