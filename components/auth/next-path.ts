/** Only a path inside this app may be a return address: never another site. */
export function safeNext(next: unknown): string | undefined {
  if (typeof next !== 'string') return undefined;
  if (!next.startsWith('/') || next.startsWith('//') || next.includes('\\')) return undefined;
  return next;
}
