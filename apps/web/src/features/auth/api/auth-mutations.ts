import type { Me, SignInInput, SignUpInput } from "@tagloom/contracts";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { meQueryOptions } from "./get-me";
import { ownErrorMeta } from "@/lib/query-client";

export const signIn = (input: SignInInput) => api.post<Me>("/auth/sign-in", input);
export const signUp = (input: SignUpInput) => api.post<Me & { organizationId: string }>("/auth/sign-up", input);
export const signOut = () => api.post<void>("/auth/sign-out");
export const requestPasswordReset = (email: string) => api.post<{ ok: true }>("/auth/password-reset/request", { email });
export const confirmPasswordReset = (token: string, password: string) => api.post<void>("/auth/password-reset/confirm", { token, password });
export const verifyEmail = (token: string) => api.post<void>("/auth/verify-email", { token });
export const resendVerification = () => api.post<{ ok: true }>("/auth/verify-email/resend");

/** After any change of who is signed in, everything cached belongs to someone else: drop it. */
function useSessionChange() {
  const qc = useQueryClient();
  return async (me: Me | null) => {
    qc.clear();
    qc.setQueryData(meQueryOptions().queryKey, me);
  };
}

export function useSignIn() {
  const onChange = useSessionChange();
  return useMutation({ meta: ownErrorMeta, mutationFn: signIn, onSuccess: (me) => onChange(me) });
}

export function useSignUp() {
  const onChange = useSessionChange();
  return useMutation({ meta: ownErrorMeta, mutationFn: signUp, onSuccess: (me) => onChange({ user: me.user, memberships: me.memberships }) });
}

export function useSignOut() {
  const onChange = useSessionChange();
  return useMutation({ mutationFn: signOut, onSettled: () => onChange(null) });
}
