// The signed-in user for this request, set once by the root middleware and read by loaders and actions.
import { createContext } from "react-router";

export interface CurrentUser {
  id: string;
  email: string;
  name: string;
  profession: string | null;
  registrationState: "unverified" | "verified" | "revoked" | null;
}

export const userContext = createContext<CurrentUser | null>(null);
