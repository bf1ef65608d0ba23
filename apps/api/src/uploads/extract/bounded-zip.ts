import type { Readable } from "node:stream";
import yauzl, { type Entry, type ZipFile } from "yauzl";
import { FileRefusal } from "./refusal";

/** Limits on what one archive may unpack to: entries, and bytes over all parts read. */
export type ZipLimits = { maxEntries: number; maxUnpackedBytes: number };

/** The file interface mammoth reads a DOCX through (mammoth/lib/zipfile.js). */
export type MammothZip = {
  exists(name: string): boolean;
  read(name: string, encoding?: string): Promise<Uint8Array | string>;
  write(name: string, contents: unknown): void;
  toArrayBuffer(): Promise<ArrayBuffer>;
};

const mb = (n: number) => `${(n / (1024 * 1024)).toLocaleString("en", { maximumFractionDigits: 1 })} MB`;

function listEntries(zip: ZipFile, limits: ZipLimits): Promise<Map<string, Entry>> {
  return new Promise((resolve, reject) => {
    const entries = new Map<string, Entry>();
    let declared = 0;
    zip.on("error", reject);
    zip.on("entry", (entry: Entry) => {
      declared += entry.uncompressedSize;
      if (entries.size >= limits.maxEntries) {
        return reject(new FileRefusal(`holds more than ${limits.maxEntries.toLocaleString("en")} parts; a DOCX file may have at most that many`));
      }
      if (declared > limits.maxUnpackedBytes) {
        return reject(new FileRefusal(`would unpack to more than ${mb(limits.maxUnpackedBytes)} (its archive says so); a DOCX file may unpack to at most ${mb(limits.maxUnpackedBytes)}`));
      }
      entries.set(entry.fileName, entry);
      zip.readEntry();
    });
    zip.on("end", () => resolve(entries));
    zip.readEntry();
  });
}

/**
 * Opens a DOCX's ZIP archive for mammoth without trusting it: the sizes its central directory
 * declares are summed before anything is inflated, and each part is inflated only when mammoth
 * asks for it, counting bytes, so an archive that lies about its sizes is stopped at the limit
 * instead of filling memory (a "decompression bomb"). Parts are read once and kept.
 */
export async function openBoundedZip(bytes: Uint8Array, limits: ZipLimits): Promise<MammothZip> {
  let zip: ZipFile;
  try {
    zip = await yauzl.fromBufferPromise(Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength), { lazyEntries: true, validateEntrySizes: true, strictFileNames: false });
  } catch {
    throw new FileRefusal("is damaged or not a DOCX file (it is not a readable ZIP archive)");
  }
  const entries = await listEntries(zip, limits).catch((err: unknown) => {
    if (err instanceof FileRefusal) throw err;
    throw new FileRefusal("is damaged or not a DOCX file (its ZIP directory cannot be read)");
  });
  let unpacked = 0;
  const cache = new Map<string, Promise<Buffer>>();
  const tooBig = () => new FileRefusal(`unpacks to more than ${mb(limits.maxUnpackedBytes)}; a DOCX file may unpack to at most ${mb(limits.maxUnpackedBytes)}`);

  const inflate = async (entry: Entry): Promise<Buffer> => {
    let stream: Readable;
    try {
      stream = await zip.openReadStreamPromise(entry);
    } catch {
      throw new FileRefusal(`is damaged (its part ${JSON.stringify(entry.fileName.slice(0, 100))} cannot be unpacked)`);
    }
    const chunks: Buffer[] = [];
    try {
      for await (const chunk of stream as AsyncIterable<Buffer>) {
        unpacked += chunk.length;
        if (unpacked > limits.maxUnpackedBytes) {
          stream.destroy();
          throw tooBig();
        }
        chunks.push(chunk);
      }
    } catch (err) {
      if (err instanceof FileRefusal) throw err;
      // yauzl checks each part against its declared size and CRC as it inflates.
      if (/too many bytes|bytes in the stream/i.test((err as Error)?.message ?? "")) throw tooBig();
      throw new FileRefusal(`is damaged (its part ${JSON.stringify(entry.fileName.slice(0, 100))} cannot be unpacked)`);
    }
    return Buffer.concat(chunks);
  };

  return {
    exists: (name) => entries.has(name),
    read: async (name, encoding) => {
      const entry = entries.get(name);
      if (!entry) throw new FileRefusal(`is damaged (its part ${JSON.stringify(name.slice(0, 100))} is missing)`);
      let data = cache.get(name);
      if (!data) {
        data = inflate(entry);
        cache.set(name, data);
      }
      const buf = await data;
      if (encoding === "base64") return buf.toString("base64");
      if (encoding) return new TextDecoder(encoding).decode(buf);
      return new Uint8Array(buf.buffer, buf.byteOffset, buf.byteLength);
    },
    write: () => {
      throw new Error("the DOCX reader is read-only");
    },
    toArrayBuffer: () => Promise.reject(new Error("the DOCX reader is read-only")),
  };
}
