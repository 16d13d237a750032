import "server-only";
import { notFound } from "next/navigation";
import { AppError, type ErrorCode } from "./errors";

/**
 * For pages: the access checks throw AppError like the API does; on a page, "not yours" (and, where a
 * page is for some roles only, "not allowed") shows the framework's not-found page instead of a crash.
 */
export async function orNotFound<T>(access: Promise<T>, codes: ErrorCode[] = ["not_found"]): Promise<T> {
  try {
    return await access;
  } catch (e) {
    if (e instanceof AppError && codes.includes(e.code)) notFound();
    throw e;
  }
}
