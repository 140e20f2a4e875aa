import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/** A fresh directory under the system temp dir, with a writer and a cleanup. */
export function tempDirectory(prefix = 'takeproof-test-') {
  const directory = mkdtempSync(join(tmpdir(), prefix));
  return {
    directory,
    path: (name: string) => join(directory, name),
    write: (name: string, contents: Buffer | string) => {
      const path = join(directory, name);
      writeFileSync(path, contents);
      return path;
    },
    remove: () => rmSync(directory, { recursive: true, force: true }),
  };
}
