import { type CreatedApiToken, createApiTokenInputSchema } from "@tagloom/contracts";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Card, Notice } from "@/components/ui/card";
import { Field, Input } from "@/components/ui/field";
import { useCreateApiToken } from "../api/create-api-token";

/** Names a new token; the secret is then shown once, with a copy button, until dismissed. */
export function CreateTokenForm({ orgId }: { orgId: string }) {
  const create = useCreateApiToken(orgId);
  const [name, setName] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [created, setCreated] = useState<CreatedApiToken | null>(null);
  const [copied, setCopied] = useState(false);
  return (
    <Card className="space-y-4">
      <form
        className="flex flex-wrap items-end gap-3"
        onSubmit={(e) => {
          e.preventDefault();
          const parsed = createApiTokenInputSchema.safeParse({ name });
          if (!parsed.success) return setError(parsed.error.issues[0]?.message ?? "Name the token.");
          setError(null);
          create.mutate(parsed.data, {
            onSuccess: (t) => {
              setCreated(t);
              setCopied(false);
              setName("");
            },
            onError: (err) => setError(err.message),
          });
        }}
      >
        <div className="min-w-64 flex-1">
          <Field label="Token name" error={error ?? undefined} hint="Say which program uses it, so you know what breaks when you revoke it.">
            {(id, describedBy) => (
              <Input id={id} value={name} maxLength={100} aria-describedby={describedBy} aria-invalid={error ? true : undefined} onChange={(e) => setName(e.target.value)} />
            )}
          </Field>
        </div>
        <Button type="submit" busy={create.isPending} className="mb-5">
          Create token
        </Button>
      </form>
      {created ? (
        <Notice tone="warn">
          <p className="font-medium">Copy the secret of “{created.name}” now. It is shown only this once; Tagloom keeps only a hash of it.</p>
          <div className="mt-2 flex flex-wrap items-center gap-2">
            <code data-testid="new-token" className="rounded bg-white px-2 py-1 font-mono text-xs break-all text-ink-900">
              {created.token}
            </code>
            <Button
              size="sm"
              variant="secondary"
              onClick={async () => {
                try {
                  await navigator.clipboard.writeText(created.token);
                  setCopied(true);
                } catch {
                  setCopied(false);
                }
              }}
            >
              {copied ? "Copied" : "Copy"}
            </Button>
            <Button size="sm" variant="ghost" onClick={() => setCreated(null)}>
              I have stored it
            </Button>
          </div>
        </Notice>
      ) : null}
    </Card>
  );
}
