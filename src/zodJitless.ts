/**
 * Imported first by every client entry (page and workers): zod then validates without compiling code at run time,
 * so it never probes `new Function`, which the Content-Security-Policy forbids (no 'unsafe-eval').
 */
import { z } from 'zod';

z.config({ jitless: true });
