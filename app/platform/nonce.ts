// The per-response CSP nonce, handed from the server entry to <Scripts> (empty in the browser).
import { createContext, useContext } from "react";

export const NonceContext = createContext("");
export const useNonce = () => useContext(NonceContext);
