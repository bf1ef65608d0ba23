import type { FieldValues, Path, UseFormSetError } from "react-hook-form";
import { ApiError } from "@/lib/api-client";

/**
 * Puts the API's field errors (400 details) on the form's fields and returns the message for
 * the form as a whole (or null when every message found its field).
 */
export function applyApiErrors<T extends FieldValues>(err: unknown, setError: UseFormSetError<T>, fields: readonly Path<T>[]): string | null {
  if (!(err instanceof ApiError)) return "Something went wrong. Try again.";
  let placed = false;
  for (const [key, messages] of Object.entries(err.fieldErrors)) {
    if ((fields as readonly string[]).includes(key) && messages[0]) {
      setError(key as Path<T>, { type: "server", message: messages[0] });
      placed = true;
    }
  }
  return placed && err.status === 400 ? null : err.message;
}
