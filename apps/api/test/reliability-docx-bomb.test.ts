import { crc32, deflateRawSync } from "node:zlib";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { uploadFiles, waitForUpload } from "./support/corpora";
import { makeDocx } from "./support/files/docx";
import type { SignedIn } from "./support/http";
import { countDocuments, startManagerCorpus } from "./support/manager-corpus";

vi.hoisted(() => {
  process.env.UPLOAD_MAX_DOCX_UNPACKED_BYTES = String(8 * 1024 * 1024);
});

/**
 * A ZIP with deflated entries whose central directory may lie about the unpacked size (PKWARE,
 * "APPNOTE.TXT - .ZIP File Format Specification", 6.3.9, §4.3.7, §4.3.12, §4.3.16; method 8 is
 * deflate, §4.4.5). A run of one repeated byte deflates about 1000:1 (RFC 1951 length/distance
 * pairs of at most 258 bytes), the usual shape of a decompression bomb.
 */
function makeDeflatedZip(entries: Array<{ name: string; data: Buffer; declaredSize?: number }>): Buffer {
  const locals: Buffer[] = [];
  const centrals: Buffer[] = [];
  let offset = 0;
  for (const { name, data, declaredSize } of entries) {
    const packed = deflateRawSync(data);
    const nameBytes = Buffer.from(name, "utf8");
    const size = declaredSize ?? data.length;
    const crc = crc32(data);
    const local = Buffer.alloc(30);
    local.writeUInt32LE(0x04034b50, 0);
    local.writeUInt16LE(20, 4);
    local.writeUInt16LE(0x0800, 6);
    local.writeUInt16LE(8, 8);
    local.writeUInt32LE(crc, 14);
    local.writeUInt32LE(packed.length, 18);
    local.writeUInt32LE(size, 22);
    local.writeUInt16LE(nameBytes.length, 26);
    locals.push(local, nameBytes, packed);
    const central = Buffer.alloc(46);
    central.writeUInt32LE(0x02014b50, 0);
    central.writeUInt16LE(20, 4);
    central.writeUInt16LE(20, 6);
    central.writeUInt16LE(0x0800, 8);
    central.writeUInt16LE(8, 10);
    central.writeUInt32LE(crc, 16);
    central.writeUInt32LE(packed.length, 20);
    central.writeUInt32LE(size, 24);
    central.writeUInt16LE(nameBytes.length, 28);
    central.writeUInt32LE(offset, 42);
    centrals.push(central, nameBytes);
    offset += 30 + nameBytes.length + packed.length;
  }
  const centralSize = centrals.reduce((n, b) => n + b.length, 0);
  const end = Buffer.alloc(22);
  end.writeUInt32LE(0x06054b50, 0);
  end.writeUInt16LE(entries.length, 8);
  end.writeUInt16LE(entries.length, 10);
  end.writeUInt32LE(centralSize, 12);
  end.writeUInt32LE(offset, 16);
  return Buffer.concat([...locals, ...centrals, end]);
}

const CONTENT_TYPES =
  '<?xml version="1.0" encoding="UTF-8"?><Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/><Override PartName="/word/document.xml" ContentType="application/vnd.openxmlformats-officedocument.wordprocessingml.document.main+xml"/></Types>';
const RELS =
  '<?xml version="1.0" encoding="UTF-8"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/officeDocument" Target="word/document.xml"/></Relationships>';

/** A DOCX whose document part is `padding` bytes of spaces inside one paragraph (valid XML). */
function bombDocx(padding: number, declaredSize?: number): Buffer {
  const head = Buffer.from('<?xml version="1.0" encoding="UTF-8"?><w:document xmlns:w="http://schemas.openxmlformats.org/wordprocessingml/2006/main"><w:body><w:p><w:r><w:t>Bomb');
  const tail = Buffer.from("</w:t></w:r></w:p></w:body></w:document>");
  const doc = Buffer.concat([head, Buffer.alloc(padding, 0x20), tail]);
  return makeDeflatedZip([
    { name: "[Content_Types].xml", data: Buffer.from(CONTENT_TYPES) },
    { name: "_rels/.rels", data: Buffer.from(RELS) },
    { name: "word/document.xml", data: doc, ...(declaredSize === undefined ? {} : { declaredSize }) },
  ]);
}

let admin: SignedIn;
let manager: SignedIn;
let corpusId: string;

beforeAll(async () => {
  ({ admin, manager, corpusId } = await startManagerCorpus("Pellow Archive Office", "Bomb corpus", ["PARTY"]));
});

const documentCount = () => countDocuments(corpusId);

describe("DOCX decompression bombs", () => {
  it("refuses an archive that declares more than the limit before inflating it; the good file beside it is imported", async () => {
    const bomb = bombDocx(40 * 1024 * 1024); // 40 MB of text in about 40 kB
    expect(bomb.length).toBeLessThan(200 * 1024);
    const before = await documentCount();
    const res = await uploadFiles(manager.agent, admin.orgId, corpusId, [
      { name: "bomb.docx", content: bomb },
      { name: "fine.docx", content: makeDocx(["Orders from Tuvelle Freight arrive weekly."]) },
    ]);
    expect(res.status).toBe(202);
    const result = await waitForUpload(manager.agent, admin.orgId, corpusId, res.body.upload.id);
    const byName = Object.fromEntries(result.files.map((f) => [f.filename, f]));
    expect(byName["bomb.docx"]).toMatchObject({ state: "failed", documentsCreated: 0 });
    expect(byName["bomb.docx"]!.error).toMatch(/would unpack to more than 8 MB \(its archive says so\)/);
    expect(byName["fine.docx"]).toMatchObject({ state: "ready", documentsCreated: 1 });
    expect(await documentCount()).toBe(before + 1);
  });

  it("stops inflating an archive that lies about its sizes at the limit", async () => {
    const liar = bombDocx(40 * 1024 * 1024, 1000); // declares 1 kB
    const before = await documentCount();
    const res = await uploadFiles(manager.agent, admin.orgId, corpusId, [{ name: "liar.docx", content: liar }]);
    const result = await waitForUpload(manager.agent, admin.orgId, corpusId, res.body.upload.id);
    expect(result.files[0]).toMatchObject({ state: "failed", documentsCreated: 0 });
    expect(result.files[0]!.error).toMatch(/unpacks to more than 8 MB/);
    expect(await documentCount()).toBe(before);
  });

  it("still reads an ordinary deflated DOCX", async () => {
    const res = await uploadFiles(manager.agent, admin.orgId, corpusId, [{ name: "small.docx", content: bombDocx(10) }]);
    const result = await waitForUpload(manager.agent, admin.orgId, corpusId, res.body.upload.id);
    expect(result.files[0]).toMatchObject({ state: "ready", documentsCreated: 1 });
  });
});
