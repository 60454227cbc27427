import { z } from 'zod';

// zod compiles a fast parser for each object schema with `new Function`, probing for eval when
// the schema is built. The web app's Content-Security-Policy refuses eval (and reports the
// probe as a violation), so the client runs zod's plain parser: its bodies and forms are small.
// This must run before any schema is built, so it is the first import of the schema kit.
z.config({ jitless: true });
