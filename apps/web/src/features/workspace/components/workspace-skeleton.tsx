/** The workspace's shape while the document opens: title, text lines and the schema panel. */
export function WorkspaceSkeleton() {
  const widths = [96, 88, 93, 70, 0, 91, 84, 60];
  return (
    <div role="status" className="animate-pulse space-y-4 motion-reduce:animate-none" data-testid="skeleton">
      <span className="sr-only">Opening the document…</span>
      <div aria-hidden className="space-y-2">
        <div className="h-3 w-20 rounded bg-ink-100" />
        <div className="h-6 w-2/3 max-w-lg rounded bg-ink-100" />
      </div>
      <div aria-hidden className="flex flex-col gap-3 lg:flex-row">
        <div className="flex-1 space-y-4 rounded-lg border border-ink-100 bg-white p-6">
          {widths.map((w, i) => (w ? <div key={i} className="h-4 rounded bg-ink-100" style={{ width: `${w}%` }} /> : <div key={i} className="h-2" />))}
        </div>
        <div className="w-full space-y-2 rounded-lg border border-ink-100 bg-white p-3 lg:w-72">
          {[1, 2, 3, 4].map((i) => (
            <div key={i} className="h-5 rounded bg-ink-50" />
          ))}
        </div>
      </div>
    </div>
  );
}
