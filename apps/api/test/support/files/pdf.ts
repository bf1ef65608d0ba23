/**
 * Hand-written PDFs for upload tests: plain text pages in Helvetica, a page with only a drawn
 * rectangle (no text layer, like a scan), and a file with a standard-security /Encrypt dictionary
 * whose user password is not empty. Objects and the cross-reference table follow the PDF 1.4
 * layout (Adobe, "PDF Reference", 3rd ed., sections 3.4 "File Structure" and 3.5 "Encryption").
 */

function escapePdfString(s: string): string {
  return s.replace(/[\\()]/g, (c) => `\\${c}`);
}

function build(objects: string[], trailerExtra = ""): Buffer {
  let out = "%PDF-1.4\n%\xE2\xE3\xCF\xD3\n";
  const offsets: number[] = [];
  objects.forEach((body, i) => {
    offsets.push(Buffer.byteLength(out, "latin1"));
    out += `${i + 1} 0 obj\n${body}\nendobj\n`;
  });
  const xref = Buffer.byteLength(out, "latin1");
  out += `xref\n0 ${objects.length + 1}\n0000000000 65535 f \n`;
  for (const o of offsets) out += `${String(o).padStart(10, "0")} 00000 n \n`;
  out += `trailer\n<< /Size ${objects.length + 1} /Root 1 0 R ${trailerExtra}>>\nstartxref\n${xref}\n%%EOF\n`;
  return Buffer.from(out, "latin1");
}

function stream(content: string): string {
  return `<< /Length ${Buffer.byteLength(content, "latin1")} >>\nstream\n${content}\nendstream`;
}

/** A PDF with one page per entry; each page's lines are written top-down. */
export function makePdf(pages: string[][], trailerExtra = "", extraObjects: string[] = []): Buffer {
  // 1 catalog, 2 pages, 3 font, then page + content pairs, then extra objects.
  const kids = pages.map((_, i) => `${4 + 2 * i} 0 R`).join(" ");
  const objects = ["<< /Type /Catalog /Pages 2 0 R >>", `<< /Type /Pages /Kids [${kids}] /Count ${pages.length} >>`, "<< /Type /Font /Subtype /Type1 /BaseFont /Helvetica >>"];
  pages.forEach((lines, i) => {
    objects.push(`<< /Type /Page /Parent 2 0 R /MediaBox [0 0 612 792] /Resources << /Font << /F1 3 0 R >> >> /Contents ${5 + 2 * i} 0 R >>`);
    const body = lines.map((line, k) => `BT /F1 12 Tf 72 ${720 - 18 * k} Td (${escapePdfString(line)}) Tj ET`).join("\n");
    objects.push(stream(body));
  });
  objects.push(...extraObjects);
  return build(objects, trailerExtra);
}

/** A one-page PDF whose page only fills a rectangle: no text at all, as a scanned page. */
export function makeImageOnlyPdf(): Buffer {
  const objects = [
    "<< /Type /Catalog /Pages 2 0 R >>",
    "<< /Type /Pages /Kids [3 0 R] /Count 1 >>",
    "<< /Type /Page /Parent 2 0 R /MediaBox [0 0 612 792] /Contents 4 0 R >>",
    stream("0.5 g 72 72 468 648 re f"),
  ];
  return build(objects);
}

/**
 * A PDF with a revision-2 standard-security handler whose /U entry does not match the empty user
 * password, so a reader must ask for a password (section 3.5.2, Algorithms 3.4 and 3.6).
 */
export function makeEncryptedPdf(): Buffer {
  const hex32 = (byte: string) => `<${byte.repeat(32)}>`;
  const pages = [["Secret minutes of the Lowmere board."]];
  // The /Encrypt dictionary is the last object: 3 fixed + 2 per page + 1.
  const encryptId = 3 + 2 * pages.length + 1;
  return makePdf(pages, `/Encrypt ${encryptId} 0 R /ID [<0123456789abcdef0123456789abcdef> <0123456789abcdef0123456789abcdef>] `, [
    `<< /Filter /Standard /V 1 /R 2 /O ${hex32("7a")} /U ${hex32("3c")} /P -44 >>`,
  ]);
}
