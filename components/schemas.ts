import { useEffect, useState } from 'react';
import type * as Kit from './schema-kit';

/** zod, the shared schemas and the app's own form schemas, in one lazily loaded module. */
export type SchemaKit = typeof Kit;

/** Names one schema of the kit, e.g. `(k) => k.labSchema`: the kit loads when it is first needed. */
export type SchemaPick<S> = (kit: SchemaKit) => S;

let loaded: SchemaKit | undefined;
let loading: Promise<SchemaKit> | undefined;

/**
 * The schema kit, loaded once. On the web it is its own chunk, so zod stays out of the first page
 * load; the app fetches it on the first request or form check, or earlier when idle (preload.ts).
 * A failed load (no connection) is forgotten, so the next call tries again.
 */
export function loadSchemaKit(): Promise<SchemaKit> {
  loading ??= import('./schema-kit').then(
    (kit) => {
      loaded = kit;
      return kit;
    },
    (err: unknown) => {
      loading = undefined;
      throw err;
    },
  );
  return loading;
}

/** The kit for a component that checks values while rendering: undefined until it has loaded. */
export function useSchemaKit(): SchemaKit | undefined {
  const [kit, setKit] = useState(loaded);
  useEffect(() => {
    if (kit) return;
    let live = true;
    loadSchemaKit().then(
      (k) => live && setKit(k),
      () => undefined,
    );
    return () => {
      live = false;
    };
  }, [kit]);
  return kit;
}
