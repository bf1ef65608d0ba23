import { KEY_HELP } from "../lib/keymap";

/** The keys of the workspace, always on screen. */
export function KeysCard() {
  return (
    <section aria-labelledby="keys-title" className="rounded-lg border border-ink-100 bg-white p-3">
      <h2 id="keys-title" className="px-1 text-xs font-semibold tracking-wide text-ink-500 uppercase">
        Keys
      </h2>
      <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 px-1 text-xs">
        {KEY_HELP.map(([keys, what]) => (
          <div key={keys} className="contents">
            <dt>
              <kbd className="font-mono whitespace-nowrap text-ink-800">{keys}</kbd>
            </dt>
            <dd className="text-ink-500">{what}</dd>
          </div>
        ))}
      </dl>
      <p className="mt-2 px-1 text-xs text-ink-500">Mouse: drag across words to select (whole words only), Shift+click to stretch, click a span to change or remove it.</p>
    </section>
  );
}
