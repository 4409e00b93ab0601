import type { FieldValues, Path, UseFormSetError } from "react-hook-form";
import { toast } from "sonner";

type Failure = { ok: false; status: number; error: string; field?: string; issues?: { field: string; message: string }[] };

/** Puts a failed action's messages on the fields they name, and a toast for the rest. */
export function showFailure<T extends FieldValues>(result: Failure, setError?: UseFormSetError<T>, fields: string[] = []) {
  let placed = false;
  for (const issue of result.issues ?? (result.field ? [{ field: result.field, message: result.error }] : [])) {
    const name = issue.field.split(".").pop() ?? issue.field;
    if (setError && fields.includes(name)) {
      setError(name as Path<T>, { message: issue.message });
      placed = true;
    }
  }
  toast.error(placed ? "Not saved: check the highlighted fields." : `Not saved: ${result.error}`);
}
