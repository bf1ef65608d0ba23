import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/card";
import { Dialog } from "@/components/ui/dialog";
import { Field, Input, Select } from "@/components/ui/field";
import { useToast } from "@/components/ui/toaster";
import { formatCount } from "@/lib/format";
import { useSetSplit } from "../api/set-split";

/**
 * Splits the corpus at random into train and test by a percentage and a seed: the same seed over
 * the same documents always gives the same split, so a split can be reproduced or reported.
 */
export function RandomSplitDialog({
  orgId,
  corpusId,
  open,
  onClose,
  counts,
}: {
  orgId: string;
  corpusId: string;
  open: boolean;
  onClose: () => void;
  counts: { all: number; unassigned: number };
}) {
  const setSplit = useSetSplit(orgId, corpusId);
  const toast = useToast();
  const [percent, setPercent] = useState("20");
  const [seed, setSeed] = useState(() => String(Math.floor(Math.random() * 1_000_000)));
  const [scope, setScope] = useState<"all" | "unassigned">("all");
  const [error, setError] = useState<string | null>(null);
  const p = Number(percent);
  const s = Number(seed);
  const percentOk = Number.isInteger(p) && p >= 0 && p <= 100;
  const seedOk = seed.trim() !== "" && Number.isInteger(s) && s >= 0 && s <= 2 ** 31 - 1;
  const n = scope === "all" ? counts.all : counts.unassigned;
  const test = percentOk ? Math.round((n * p) / 100) : 0;
  return (
    <Dialog open={open} title="Random split" onClose={onClose}>
      <form
        className="space-y-4"
        onSubmit={async (e) => {
          e.preventDefault();
          if (!percentOk || !seedOk) return;
          setError(null);
          try {
            const r = await setSplit.mutateAsync({ testPercent: p, seed: s, scope });
            toast.show(`Split: ${formatCount(r.train)} train, ${formatCount(r.test)} test.`, "success");
            onClose();
          } catch (err) {
            setError((err as Error).message);
          }
        }}
      >
        {error ? <Notice tone="error">{error}</Notice> : null}
        <div className="grid gap-3 sm:grid-cols-2">
          <Field label="Test share (%)" error={percentOk ? undefined : "Use a whole number from 0 to 100."}>
            {(id, d) => <Input id={id} inputMode="numeric" aria-describedby={d} aria-invalid={!percentOk} value={percent} onChange={(e) => setPercent(e.target.value)} />}
          </Field>
          <Field label="Seed" error={seedOk ? undefined : "Use a whole number from 0 to 2147483647."} hint="Keep it to repeat this split.">
            {(id, d) => <Input id={id} inputMode="numeric" aria-describedby={d} aria-invalid={!seedOk} value={seed} onChange={(e) => setSeed(e.target.value)} />}
          </Field>
        </div>
        <Field label="Documents">
          {(id) => (
            <Select id={id} value={scope} onChange={(e) => setScope(e.target.value as "all" | "unassigned")}>
              <option value="all">All documents ({formatCount(counts.all)}), replacing their splits</option>
              <option value="unassigned">Only those in neither split ({formatCount(counts.unassigned)})</option>
            </Select>
          )}
        </Field>
        <p className="text-sm text-ink-700">
          {formatCount(test)} test and {formatCount(n - test)} train documents.
        </p>
        <div className="flex gap-2">
          <Button type="submit" busy={setSplit.isPending} disabled={!percentOk || !seedOk || n === 0}>
            Split
          </Button>
          <Button variant="secondary" onClick={onClose}>
            Cancel
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
