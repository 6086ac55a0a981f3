// archiver 8 ships no types; only what the certificates ZIP uses.
declare module 'archiver' {
  import type { Transform } from 'node:stream';
  export class ZipArchive extends Transform {
    constructor(options?: { zlib?: { level?: number }; store?: boolean; comment?: string });
    append(source: Buffer | string | NodeJS.ReadableStream, data: { name: string; date?: Date }): this;
    finalize(): Promise<void>;
  }
}
