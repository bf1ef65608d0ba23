import { QueryClientProvider } from "@tanstack/react-query";
import { type ReactNode, useEffect, useState } from "react";
import { ToastProvider, useToast } from "@/components/ui/toaster";
import { onApiError } from "@/lib/api-client";
import { createQueryClient, isOwnError } from "@/lib/query-client";

/**
 * Shows a toast for the network, the server's own faults and rate limits, unless the error belongs
 * to a mutation whose screen shows it already (`ownErrorMeta`): one message, in one place.
 */
export function ApiErrorToasts() {
  const toast = useToast();
  useEffect(
    () =>
      onApiError((err) => {
        if (!(err.status === 0 || err.status >= 500 || err.status === 429) || err.shownByCaller) return;
        // The client reports the error before the failing request's promise chain reaches the
        // mutation cache; that chain runs on microtasks, so it has finished by the next task.
        setTimeout(() => {
          if (!isOwnError(err)) toast.show(err.message, "error");
        }, 0);
      }),
    [toast],
  );
  return null;
}

export function AppProvider({ children }: { children: ReactNode }) {
  const [client] = useState(createQueryClient);
  return (
    <QueryClientProvider client={client}>
      <ToastProvider>
        <ApiErrorToasts />
        {children}
      </ToastProvider>
    </QueryClientProvider>
  );
}
