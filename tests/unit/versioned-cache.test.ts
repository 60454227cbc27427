import { VersionedCache, type Versioned } from '../../server/services/versioned-cache';

const entry = (version: string, value: string, bytes = 10): Versioned<string> => ({
  version,
  value,
  bytes,
});

describe('VersionedCache', () => {
  it('serves an entry only at the version it was computed for', async () => {
    const cache = new VersionedCache<string>(1000);
    await cache.compute('k', '1', async () => entry('1', 'one'));
    expect(cache.get('k', '1')).toBe('one');
    expect(cache.get('k', '2')).toBeUndefined();
  });

  it('computes once for callers that saw the same version at the same time', async () => {
    const cache = new VersionedCache<string>(1000);
    let runs = 0;
    const run = async () => {
      runs++;
      await new Promise((r) => setTimeout(r, 5));
      return entry('3', 'three');
    };
    const answers = await Promise.all([1, 2, 3].map(() => cache.compute('k', '3', run)));
    expect(answers).toEqual(['three', 'three', 'three']);
    expect(runs).toBe(1);
  });

  it('does not hand a caller that saw a newer version the answer of an older computation', async () => {
    const cache = new VersionedCache<string>(1000);
    let release!: () => void;
    const slow = cache.compute('k', '4', async () => {
      await new Promise<void>((r) => (release = r));
      return entry('4', 'old');
    });
    const fresh = cache.compute('k', '5', async () => entry('5', 'new'));
    expect(await fresh).toBe('new');
    release();
    expect(await slow).toBe('old');
    // The late, older answer does not replace the newer one.
    expect(cache.get('k', '5')).toBe('new');
  });

  it('forgets the least recently used entries beyond its byte budget', async () => {
    const cache = new VersionedCache<string>(25);
    await cache.compute('a', '1', async () => entry('1', 'a'));
    await cache.compute('b', '1', async () => entry('1', 'b'));
    cache.get('a', '1');
    await cache.compute('c', '1', async () => entry('1', 'c'));
    expect(cache.get('b', '1')).toBeUndefined();
    expect(cache.get('a', '1')).toBe('a');
    expect(cache.get('c', '1')).toBe('c');
    expect(cache.size).toBe(2);
  });

  it('keeps nothing from a computation that failed, and lets the next caller try again', async () => {
    const cache = new VersionedCache<string>(1000);
    await expect(
      cache.compute('k', '1', async () => {
        throw new Error('database went away');
      }),
    ).rejects.toThrow('database went away');
    expect(await cache.compute('k', '1', async () => entry('1', 'ok'))).toBe('ok');
  });
});
