/** A small hand-written labelled corpus for unit tests of the high-level tagger (used only by tests). */
import type { ColumnDocument } from "../text/conll";

const raw = [
  [
    "John Smith lives in Paris .|B-PER I-PER O O B-LOC O",
    "He works for Acme Corp in London .|O O O B-ORG I-ORG O B-LOC O",
    "Mary visited Berlin in 1990 .|B-PER O B-LOC O O O",
  ],
  [
    "The Beatles played in Liverpool .|O B-ORG O O B-LOC O",
    "Paul McCartney met John Lennon .|B-PER I-PER O B-PER I-PER O",
    "They recorded Abbey Road in London .|O O B-MISC I-MISC O B-LOC O",
  ],
  [
    "Acme Corp hired Mary .|B-ORG I-ORG O B-PER O",
    "Paris is in France .|B-LOC O O B-LOC O",
    "The French team won the Cup .|O B-MISC O O O B-MISC O",
    "John moved to Berlin .|B-PER O O B-LOC O",
  ],
];

export const tinyDocuments: ColumnDocument[] = raw.map((doc) => ({
  sentences: doc.map((line) => {
    const [words, tags] = line.split("|");
    return { words: words.split(" "), tags: tags.split(" ") };
  }),
}));

/** Unlabelled sentences in the same style. */
export const tinyUnlabelled: string[][][] = [
  [
    "Lisa Brown lives in Madrid .".split(" "),
    "She works for Globex in Rome .".split(" "),
  ],
  ["George Harrison played in Hamburg .".split(" "), "The team visited London in 1991 .".split(" ")],
];
