import { QueryClientProvider } from "@tanstack/react-query";
import { type ReactNode, useEffect, useState } from "react";
import { ToastProvider, useToast } from "@/components/ui/toaster";
import { onApiError } from "@/lib/api-client";
import { createQueryClient } from "@/lib/query-client";

/** Shows a toast for errors no screen can handle itself: the network and the server's own faults. */
function ApiErrorToasts() {
  const toast = useToast();
  useEffect(
    () =>
      onApiError((err) => {
        if (err.status === 0 || err.status >= 500) toast.show(err.message, "error");
        if (err.status === 429) toast.show(err.message, "error");
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
