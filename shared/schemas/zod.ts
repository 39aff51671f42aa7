import { z } from 'zod'

// In the browser zod's compiled fast path probes `new Function` when a schema is defined, which the
// content security policy refuses (no 'unsafe-eval'); the interpreted path gives the same results.
// Every schema module imports zod from here so the switch is set before the first schema exists.
if ((globalThis as { window?: unknown }).window !== undefined) z.config({ jitless: true })

export { z }
