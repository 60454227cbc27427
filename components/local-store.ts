// Where unsent work waits. Native builds keep it for the life of the app; the web build keeps
// it in localStorage (local-store.web.ts), so a reload or a closed tab loses nothing.
const memory = new Map<string, string>();

export function readLocal<T>(key: string): T | undefined {
  const text = memory.get(key);
  return text === undefined ? undefined : (JSON.parse(text) as T);
}

export function writeLocal(key: string, value: unknown): void {
  memory.set(key, JSON.stringify(value));
}
