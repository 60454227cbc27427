import type { PhotoStore } from '../../server/photos/store';

/** A stored photo read whole, or undefined when the store has no such key. */
export async function readWhole(store: PhotoStore, key: string): Promise<Buffer | undefined> {
  const found = await store.open(key);
  if (!found) return undefined;
  const chunks: Buffer[] = [];
  for await (const chunk of found.body) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks);
}
