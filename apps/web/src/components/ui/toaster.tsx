import { createContext, type ReactNode, useCallback, useContext, useMemo, useRef, useState } from "react";
import { cn } from "@/lib/cn";

type Toast = { id: number; tone: "info" | "error" | "success"; message: string };
type ToastApi = { show: (message: string, tone?: Toast["tone"]) => void };

const ToastContext = createContext<ToastApi>({ show: () => undefined });

/** How long a toast stays (ms). */
const TOAST_MS = 6000;

/** Short messages in the corner of the screen that disappear by themselves. */
export function ToastProvider({ children }: { children: ReactNode }) {
  const [toasts, setToasts] = useState<Toast[]>([]);
  const [opened, setOpened] = useState<number | null>(null);
  const timers = useRef(new Map<number, ReturnType<typeof setTimeout>>());
  const dismissLater = useCallback((id: number) => {
    clearTimeout(timers.current.get(id));
    timers.current.set(
      id,
      setTimeout(() => {
        timers.current.delete(id);
        setToasts((t) => t.filter((x) => x.id !== id));
      }, TOAST_MS),
    );
  }, []);
  const show = useCallback(
    (message: string, tone: Toast["tone"] = "info") => {
      const id = Date.now() + Math.random();
      setToasts((t) => [...t.filter((x) => x.message !== message), { id, tone, message }].slice(-4));
      dismissLater(id);
    },
    [dismissLater],
  );
  // A tap opens a toast the phone layout cut to two lines; it stays until tapped again, then goes
  // after the usual time.
  const toggle = useCallback(
    (id: number) => {
      setOpened((o) => {
        if (o === id) {
          dismissLater(id);
          return null;
        }
        clearTimeout(timers.current.get(id));
        if (o !== null) dismissLater(o);
        return id;
      });
    },
    [dismissLater],
  );
  const value = useMemo(() => ({ show }), [show]);
  return (
    <ToastContext.Provider value={value}>
      {children}
      {/* Phones: inside the sticky header's 56 px band at the top (the newest toast only, two lines
          at most until tapped: the whole text is still read out), never over the page's forms and
          their notices; wider screens: the bottom-right corner. */}
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
              "pointer-events-auto rounded-md border text-xs shadow-md sm:text-sm",
              t.tone === "error" && "border-rust-500/40 bg-white text-rust-500",
              t.tone === "success" && "border-moss-500/40 bg-white text-moss-500",
              t.tone === "info" && "border-ink-100 bg-white text-ink-800",
            )}
          >
            <button
              type="button"
              aria-expanded={opened === t.id}
              onClick={() => toggle(t.id)}
              className={cn("block w-full cursor-default px-3 py-1.5 text-left max-sm:cursor-pointer sm:px-4 sm:py-3", opened !== t.id && "max-sm:line-clamp-2")}
            >
              {t.message}
            </button>
          </div>
        ))}
      </div>
    </ToastContext.Provider>
  );
}

export function useToast(): ToastApi {
  return useContext(ToastContext);
}
