/** A small hand-written labelled corpus for unit tests of the high-level tagger (used only by tests). Every name in it is invented. */
import type { ColumnDocument } from "../text/conll";

const raw = [
  [
    "Taven Orrick lives in Velmora .|B-PER I-PER O O B-LOC O",
    "He works for Quorvel Corp in Drussel .|O O O B-ORG I-ORG O B-LOC O",
    "Ilsa visited Kestrane in 1990 .|B-PER O B-LOC O O O",
  ],
  [
    "The Marrowicks played in Ostravel .|O B-ORG O O B-LOC O",
    "Pell Vantorro met Taven Quillory .|B-PER I-PER O B-PER I-PER O",
    "They recorded Glass Lantern in Drussel .|O O B-MISC I-MISC O B-LOC O",
  ],
  [
    "Quorvel Corp hired Ilsa .|B-ORG I-ORG O B-PER O",
    "Velmora is in Vellund .|B-LOC O O B-LOC O",
    "The Vellundic team won the Cup .|O B-MISC O O O B-MISC O",
    "Taven moved to Kestrane .|B-PER O O B-LOC O",
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
    "Nessa Arvell lives in Tirranel .".split(" "),
    "She works for Plumbrix in Zerith .".split(" "),
  ],
  ["Oren Vasquill played in Dravenholt .".split(" "), "The team visited Drussel in 1991 .".split(" ")],
];
