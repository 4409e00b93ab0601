import "server-only";
import { notFound } from "next/navigation";
import { HttpError } from "@/lib/http";

/** Turns a data-layer 404 into the not-found page. */
export async function orNotFound<T>(p: Promise<T>): Promise<T> {
  try {
    return await p;
  } catch (e) {
    if (e instanceof HttpError && e.status === 404) notFound();
    throw e;
  }
}
