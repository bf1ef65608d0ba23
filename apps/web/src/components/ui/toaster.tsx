import { createContext, type ReactNode, useCallback, useContext, useMemo, useState } from "react";
import { cn } from "@/lib/cn";

type Toast = { id: number; tone: "info" | "error" | "success"; message: string };
type ToastApi = { show: (message: string, tone?: Toast["tone"]) => void };

const ToastContext = createContext<ToastApi>({ show: () => undefined });

/** Short messages in the corner of the screen that disappear by themselves. */
export function ToastProvider({ children }: { children: ReactNode }) {
  const [toasts, setToasts] = useState<Toast[]>([]);
  const show = useCallback((message: string, tone: Toast["tone"] = "info") => {
    const id = Date.now() + Math.random();
    setToasts((t) => [...t.filter((x) => x.message !== message), { id, tone, message }].slice(-4));
    setTimeout(() => setToasts((t) => t.filter((x) => x.id !== id)), 6000);
  }, []);
  const value = useMemo(() => ({ show }), [show]);
  return (
    <ToastContext.Provider value={value}>
      {children}
      {/* Phones: inside the sticky header's 56 px band at the top (the newest toast only, two lines
          at most: the whole text is still read out), never over the page's forms and their
          notices; wider screens: the bottom-right corner. */}
      <div
        aria-live="polite"
        data-testid="toast-region"
        className="pointer-events-none fixed inset-x-2 top-1 z-50 flex flex-col gap-2 sm:inset-x-auto sm:top-auto sm:right-4 sm:bottom-4 sm:w-80 max-sm:[&>*:not(:last-child)]:hidden"
      >
        {toasts.map((t) => (
          <div
            key={t.id}
            title={t.message}
            role={t.tone === "error" ? "alert" : "status"}
            className={cn(
              "pointer-events-auto rounded-md border px-3 py-1.5 text-xs shadow-md max-sm:line-clamp-2 sm:px-4 sm:py-3 sm:text-sm",
              t.tone === "error" && "border-rust-500/40 bg-white text-rust-500",
              t.tone === "success" && "border-moss-500/40 bg-white text-moss-500",
              t.tone === "info" && "border-ink-100 bg-white text-ink-800",
            )}
          >
            {t.message}
          </div>
        ))}
      </div>
    </ToastContext.Provider>
  );
}

export function useToast(): ToastApi {
  return useContext(ToastContext);
}
