import Markdown from "react-markdown";

/**
 * A guideline's Markdown rendered safely: raw HTML in the source is dropped (skipHtml) and link
 * addresses go through react-markdown's default URL filter, so `javascript:` links never render.
 */
export function GuidelineText({ source }: { source: string }) {
  if (!source.trim()) return <p className="text-sm text-ink-500 italic">No guideline yet.</p>;
  return (
    <div className="space-y-2 text-sm text-ink-800 [&_a]:text-ink-500 [&_a]:underline [&_code]:rounded [&_code]:bg-ink-50 [&_code]:px-1 [&_ol]:list-decimal [&_ol]:pl-5 [&_ul]:list-disc [&_ul]:pl-5">
      <Markdown skipHtml>{source}</Markdown>
    </div>
  );
}
