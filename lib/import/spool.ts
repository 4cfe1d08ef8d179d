import fs from "node:fs";
import os from "node:os";
import path from "node:path";

/**
 * Fixed-size binary records of validated histogram rows, written to a temporary file while the
 * upload streams in, and read back in batches inside the storing transaction. Keeps memory flat
 * whatever the file size, and keeps the database untouched (no connection held) while the client
 * is still uploading: a request killed mid-upload never reaches the database.
 * Record: lengthM f64, count f64, classIndex u32, line u32 (24 bytes).
 */
export const RECORD_BYTES = 24;
const BUFFER_RECORDS = 16_384;

export interface SpoolRecord {
  lengthM: number;
  count: number;
  classIndex: number;
  line: number;
}

export class Spool {
  readonly file: string;
  private fd: number;
  private buf = Buffer.alloc(BUFFER_RECORDS * RECORD_BYTES);
  // typed views over the same bytes: much faster than Buffer.write*LE per field (little-endian hosts)
  private f64 = new Float64Array(this.buf.buffer, this.buf.byteOffset, BUFFER_RECORDS * 3);
  private u32 = new Uint32Array(this.buf.buffer, this.buf.byteOffset, BUFFER_RECORDS * 6);
  private used = 0;
  count = 0;

  constructor(dir = os.tmpdir()) {
    const d = fs.mkdtempSync(path.join(dir, "plateau-import-"));
    this.file = path.join(d, "rows.bin");
    this.fd = fs.openSync(this.file, "w+");
  }

  push(classIndex: number, lengthM: number, count: number, line: number): void {
    const i = this.used * 3;
    this.f64[i] = lengthM;
    this.f64[i + 1] = count;
    this.u32[2 * i + 4] = classIndex;
    this.u32[2 * i + 5] = line;
    this.used += 1;
    this.count += 1;
    if (this.used === BUFFER_RECORDS) this.flush();
  }

  private flush(): void {
    if (this.used === 0) return;
    fs.writeSync(this.fd, this.buf, 0, this.used * RECORD_BYTES);
    this.used = 0;
  }

  /** Finish writing; further reads see every record. */
  close(): void {
    this.flush();
  }

  /** Call `fn` for batches of records in file order (synchronous reads). */
  *batches(batchRecords = BUFFER_RECORDS): Generator<SpoolRecord[]> {
    this.flush();
    const buf = Buffer.allocUnsafe(batchRecords * RECORD_BYTES);
    let pos = 0;
    for (;;) {
      const n = fs.readSync(this.fd, buf, 0, buf.length, pos);
      if (n <= 0) break;
      pos += n;
      const out: SpoolRecord[] = [];
      for (let o = 0; o + RECORD_BYTES <= n; o += RECORD_BYTES) {
        out.push({ lengthM: buf.readDoubleLE(o), count: buf.readDoubleLE(o + 8), classIndex: buf.readUInt32LE(o + 16), line: buf.readUInt32LE(o + 20) });
      }
      yield out;
    }
  }

  dispose(): void {
    try {
      fs.closeSync(this.fd);
    } catch {
      /* already closed */
    }
    fs.rmSync(path.dirname(this.file), { recursive: true, force: true });
  }
}
