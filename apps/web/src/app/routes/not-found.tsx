import { Link } from "react-router";
import { Brand } from "@/components/layout/brand";

export function NotFoundRoute() {
  return (
    <div className="flex min-h-full flex-col items-center justify-center gap-4 px-4 text-center">
      <Brand />
      <h1 className="text-2xl font-semibold">Nothing here</h1>
      <p className="max-w-sm text-sm text-ink-500">This page does not exist, or it belongs to an organization you are not a member of.</p>
      <Link to="/" className="text-sm font-medium text-ink-700 underline">
        Go to the start page
      </Link>
    </div>
  );
}
