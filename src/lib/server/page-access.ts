import "server-only";
import { forbidden, notFound } from "next/navigation";
import { AppError, type ErrorCode } from "./errors";

/**
 * For pages: the access checks throw AppError like the API does; on a page, "not yours" shows the framework's
 * not-found page instead of a crash (a non-member learns nothing about what exists).
 */
export async function orNotFound<T>(access: Promise<T>, codes: ErrorCode[] = ["not_found"]): Promise<T> {
  try {
    return await access;
  } catch (e) {
    if (e instanceof AppError && codes.includes(e.code)) notFound();
    throw e;
  }
}

/**
 * For pages some roles may not open: a non-member still gets 404, a member whose role may not gets 403 and the
 * nearest forbidden.tsx (the role-refusal page), which says so rather than pretending the page does not exist.
 */
export async function orRefused<T>(access: Promise<T>): Promise<T> {
  try {
    return await access;
  } catch (e) {
    if (e instanceof AppError && e.code === "not_found") notFound();
    if (e instanceof AppError && e.code === "forbidden") forbidden();
    throw e;
  }
}
