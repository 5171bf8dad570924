import { z } from "zod";

// zod 4 probes for Function() before compiling fast object parsers; under the app's
// Content-Security-Policy (no 'unsafe-eval') the probe fails and the browser reports a violation.
// Imported first by app/root.tsx so that the setting precedes every parse (docs/decisions/0012-hardening.md).
z.config({ jitless: true });
