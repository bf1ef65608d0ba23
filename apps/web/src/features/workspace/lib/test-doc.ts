import type { DocumentTokens, EntityType } from "@tagloom/contracts";

/** A small document and schema for the workspace's unit tests (tokens split at spaces). */
export function makeTestDoc(text: string): DocumentTokens {
  const starts: number[] = [];
  const ends: number[] = [];
  const sentenceStarts: number[] = [0];
  const re = /[^\s.]+|\./g;
  for (let m = re.exec(text); m; m = re.exec(text)) {
    if (starts.length && text[ends[ends.length - 1]! - 1] === ".") sentenceStarts.push(starts.length);
    starts.push(m.index);
    ends.push(m.index + m[0].length);
  }
  return { starts, ends, sentenceStarts };
}

export const testTypes: EntityType[] = [
  { id: "t1", name: "PERSON", color: "#E69F00", hotkey: "p", guideline: "People by name.", position: 0 },
  { id: "t2", name: "PLACE", color: "#56B4E9", hotkey: "l", guideline: "Towns, harbours, rooms.", position: 1 },
  { id: "t3", name: "ORG", color: "#009E73", hotkey: null, guideline: "", position: 2 },
];
