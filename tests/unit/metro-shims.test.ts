import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';

// metro.config.js resolves 'simple-statistics' to metro-simple-statistics.js, which re-exports
// single functions from the library's own source. A name imported elsewhere but missing from the
// shim would be undefined in the web app, so every import must be covered, by the same function.
const root = path.join(__dirname, '..', '..');

function sourceFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((entry) => {
    const full = path.join(dir, entry);
    if (statSync(full).isDirectory()) return sourceFiles(full);
    return /\.tsx?$/.test(entry) ? [full] : [];
  });
}

function importedNames(): Set<string> {
  const names = new Set<string>();
  for (const file of ['shared', 'components', 'app'].flatMap((d) =>
    sourceFiles(path.join(root, d)),
  )) {
    const text = readFileSync(file, 'utf8');
    for (const m of text.matchAll(/import\s*\{([^}]*)\}\s*from\s*'simple-statistics'/g)) {
      for (const name of m[1]!.split(',')) if (name.trim()) names.add(name.trim());
    }
  }
  return names;
}

describe('the web bundle’s simple-statistics shim', () => {
  const shim = readFileSync(path.join(root, 'metro-simple-statistics.js'), 'utf8');
  const exported = new Map(
    [...shim.matchAll(/export \{ default as (\w+) \} from '([^']+)'/g)].map((m) => [m[1]!, m[2]!]),
  );

  it('exports every function the app imports from simple-statistics', () => {
    const names = importedNames();
    expect(names.size).toBeGreaterThan(0);
    for (const name of names) expect([name, exported.has(name)]).toEqual([name, true]);
  });

  it('takes each function from the library module of that name', () => {
    for (const [name, file] of exported) {
      const source = path.join(root, file);
      expect(existsSync(source)).toBe(true);
      expect(readFileSync(source, 'utf8')).toMatch(new RegExp(`export default ${name};`));
    }
  });
});
