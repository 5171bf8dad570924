import { createContext } from "react";

/**
 * The Content-Security-Policy nonce of this response (docs/decisions/0012-hardening.md), set by
 * app/entry.server.tsx from the server's load context; empty in the browser, which hides nonces.
 */
export const CspNonceContext = createContext<string | undefined>(undefined);
