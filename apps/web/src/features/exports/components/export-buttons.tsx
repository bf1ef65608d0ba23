import { useState } from "react";
import { Select } from "@/components/ui/field";
import { formatCount } from "@/lib/format";
import { exportUrl } from "../api/export-link";

const linkClass = "inline-flex h-8 items-center rounded-md border border-ink-200 bg-white px-3 text-sm font-medium text-ink-800 hover:bg-ink-50";

/** Download links for the corpus's gold documents as JSONL or CoNLL (IOB2), one split or all. */
export function ExportButtons({ orgId, corpusId, goldCount }: { orgId: string; corpusId: string; goldCount: number }) {
  const [split, setSplit] = useState<"all" | "train" | "test">("all");
  return (
    <div className="flex flex-wrap items-center gap-2" aria-label="Export">
      <span className="text-sm text-ink-500">Export {formatCount(goldCount)} gold documents:</span>
      <Select aria-label="Split to export" className="h-8 w-28 py-0" value={split} onChange={(e) => setSplit(e.target.value as "all" | "train" | "test")}>
        <option value="all">All</option>
        <option value="train">Train</option>
        <option value="test">Test</option>
      </Select>
      <a className={linkClass} href={exportUrl(orgId, corpusId, { format: "jsonl", split })} download>
        JSONL
      </a>
      <a className={linkClass} href={exportUrl(orgId, corpusId, { format: "conll", split })} download>
        CoNLL
      </a>
    </div>
  );
}
