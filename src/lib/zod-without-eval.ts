import { z } from 'zod';

// zod probes for `new Function` when its first object schema is built; under
// Paraxia's CSP (no 'unsafe-eval') Chromium reports that caught probe as a
// violation. Imported first by main.tsx, before any schema exists.
z.config({ jitless: true });
