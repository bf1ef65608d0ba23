import { Link } from "react-router";

/** The product mark: three threads crossing two, and the name. */
export function Brand({ to = "/", compact = false }: { to?: string; compact?: boolean }) {
  return (
    <Link to={to} aria-label={compact ? "Tagloom" : undefined} className="flex items-center gap-2 font-semibold tracking-tight text-ink-800">
      <svg viewBox="0 0 32 32" className="size-7" aria-hidden>
        <rect width="32" height="32" rx="7" fill="#1d3557" />
        <path d="M8 10h16M8 16h16M8 22h16" stroke="#f4a259" strokeWidth="2.5" strokeLinecap="round" />
        <path d="M12 7v18M20 7v18" stroke="#e9f1f7" strokeWidth="2" strokeLinecap="round" />
      </svg>
      <span className={compact ? "hidden text-lg sm:inline" : "text-lg"}>Tagloom</span>
    </Link>
  );
}
