import { describe, expect, it } from "vitest";
import { textUtf8Decoder, type Utf8Decoder } from "@/lib/import/csv-stream";
import { nodeUtf8Decoder } from "@/lib/import/node-utf8";

/** Decode chunks; the text so far and the index of the chunk that failed (-1: none; chunks.length: at the end). */
function run(make: () => Utf8Decoder, chunks: Uint8Array[]): { text: string; failedAt: number } {
  const d = make();
  let text = "";
  for (let i = 0; i < chunks.length; i++) {
    try {
      text += d.decode(chunks[i]!);
    } catch {
      return { text, failedAt: i };
    }
  }
  try {
    text += d.end();
  } catch {
    return { text, failedAt: chunks.length };
  }
  return { text, failedAt: -1 };
}

describe("nodeUtf8Decoder", () => {
  it("gives the standard decoder's text and fails at the same chunk, on valid and broken UTF-8 cut anywhere", () => {
    let seed = 99;
    const rnd = (n: number) => ((seed = (seed * 1103515245 + 12345) % 2147483648), seed % n);
    const enc = new TextEncoder();
    const pieces = ["a", "length_um,", "µ", "é", "€", "😀", "\uFEFF", "\r\n", "中文"].map((s) => [...enc.encode(s)]);
    const junk = [0x80, 0xbf, 0xc0, 0xc1, 0xc2, 0xe0, 0xe0, 0xa0, 0xed, 0xa0, 0xf0, 0x90, 0xf4, 0x90, 0xf5, 0xff, 0xef, 0xbb, 0xbf];
    let failures = 0;
    for (let t = 0; t < 3000; t++) {
      const bytes: number[] = [];
      const len = 1 + rnd(40);
      for (let k = 0; k < len; k++) {
        if (t % 3 !== 0 && rnd(12) === 0) bytes.push(junk[rnd(junk.length)]!);
        else bytes.push(...pieces[rnd(pieces.length)]!);
      }
      if (t % 7 === 0) bytes.unshift(0xef, 0xbb, 0xbf); // a BOM
      const chunks: Uint8Array[] = [];
      for (let i = 0; i < bytes.length;) {
        const n = 1 + rnd(6);
        chunks.push(Uint8Array.from(bytes.slice(i, i + n)));
        i += n;
      }
      const want = run(textUtf8Decoder, chunks);
      const got = run(nodeUtf8Decoder, chunks);
      expect(got, JSON.stringify(bytes)).toEqual(want);
      if (want.failedAt !== -1) failures += 1;
    }
    expect(failures).toBeGreaterThan(500); // the broken inputs were broken
  });
});
