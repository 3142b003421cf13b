import { mkdir, readFile, rm, writeFile, rename } from 'node:fs/promises';
import { dirname, join, resolve } from 'node:path';

/** Where uploaded bytes live. The disk implementation is the default; an object store can implement the same. */
export interface Storage {
  put(key: string, bytes: Buffer): Promise<void>;
  /** The bytes, or null when nothing is stored under the key. */
  get(key: string): Promise<Buffer | null>;
  delete(key: string): Promise<void>;
}

const KEY = /^[a-z0-9][a-z0-9/_-]{0,200}$/i;

/** Files under one folder; keys are checked so that none can point outside it. */
export class DiskStorage implements Storage {
  readonly root: string;
  constructor(root: string) {
    this.root = resolve(root);
  }

  private path(key: string): string {
    if (!KEY.test(key) || key.includes('..')) throw new Error(`bad storage key ${key}`);
    return join(this.root, key);
  }

  async put(key: string, bytes: Buffer): Promise<void> {
    const path = this.path(key);
    await mkdir(dirname(path), { recursive: true });
    // Write then rename, so a reader never sees half a file.
    const tmp = `${path}.${process.pid}.tmp`;
    await writeFile(tmp, bytes);
    await rename(tmp, path);
  }

  async get(key: string): Promise<Buffer | null> {
    try {
      return await readFile(this.path(key));
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code === 'ENOENT') return null;
      throw err;
    }
  }

  async delete(key: string): Promise<void> {
    await rm(this.path(key), { force: true });
  }
}
