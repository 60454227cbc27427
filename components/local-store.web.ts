// The web keeps unsent work in localStorage, so a reload or a closed tab loses nothing.
export function readLocal<T>(key: string): T | undefined {
  try {
    const text = window.localStorage.getItem(key);
    return text === null ? undefined : (JSON.parse(text) as T);
  } catch {
    return undefined;
  }
}

export function writeLocal(key: string, value: unknown): void {
  window.localStorage.setItem(key, JSON.stringify(value));
}
