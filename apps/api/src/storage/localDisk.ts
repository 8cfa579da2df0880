import { mkdir, readFile, rm, writeFile, rename } from 'node:fs/promises';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import { assertSafeKey, type ObjectStorage } from './storage';

/** Files under one folder (default `.data/uploads` at the repository root). */
export function localDiskStorage(root: string): ObjectStorage {
  const base = path.resolve(root);
  const fileOf = (key: string) => {
    const file = path.resolve(base, assertSafeKey(key));
    if (!file.startsWith(base + path.sep)) throw new Error(`storage key escapes the uploads folder: ${key}`);
    return file;
  };
  return {
    driver: 'local',
    async put(key, body) {
      const file = fileOf(key);
      await mkdir(path.dirname(file), { recursive: true });
      // write then rename, so a reader never sees half a file
      const tmp = `${file}.${randomBytes(4).toString('hex')}.tmp`;
      await writeFile(tmp, body);
      await rename(tmp, file);
    },
    async get(key) {
      try {
        return await readFile(fileOf(key));
      } catch (err) {
        if ((err as NodeJS.ErrnoException).code === 'ENOENT') return null;
        throw err;
      }
    },
    async delete(key) {
      await rm(fileOf(key), { force: true });
    },
  };
}
