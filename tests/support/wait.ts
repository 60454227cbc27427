/** Polls until the value is what the test waits for, or fails after the timeout. */
export async function waitUntil<T>(
  read: () => Promise<T>,
  expected: T,
  timeoutMs = 20_000,
): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  let last: T = await read();
  while (last !== expected) {
    if (Date.now() > deadline)
      throw new Error(`waited ${timeoutMs} ms for ${String(expected)}, last saw ${String(last)}`);
    await new Promise((resolve) => setTimeout(resolve, 100));
    last = await read();
  }
}
