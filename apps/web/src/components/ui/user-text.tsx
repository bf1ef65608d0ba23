import type { ReactNode } from "react";

/**
 * Text a user typed or uploaded (a title, a file name, a person's or a corpus's name), shown
 * inline as its own bidirectional isolate (HTML `<bdi>`; Unicode Standard Annex #9, "Explicit
 * Directional Isolates"), so right-to-left text or a stray override inside it cannot reorder
 * the words beside it. The API already strips bidi controls from titles; this guards the rest.
 */
export function UserText({ children, className }: { children: ReactNode; className?: string }) {
  return <bdi className={className}>{children}</bdi>;
}
