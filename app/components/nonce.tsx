import { createContext, useContext } from "react";

// The per-request nonce that lets our own inline scripts run under the Content-Security-Policy.
export const NonceContext = createContext("");
export const useNonce = () => useContext(NonceContext);
