import "server-only";
import { forbidden, notFound, redirect } from "next/navigation";
import { requireUser } from "./access";
import { AppError, type ErrorCode } from "./errors";

/**
 * Nobody signed in: to the sign-in page, as the (app) layout does. Said here too because a page and its layouts
 * render side by side: the layout's redirect wins, but a page that threw its own "sign in" refusal had it logged
 * as a server error (about ninety lines of "⨯ Error: Sign in to continue." per test run, none of them a fault).
 */
function signInFirst(e: unknown): void {
  if (e instanceof AppError && e.code === "unauthorized") redirect("/signin");
}

/** The signed-in person, for a page any signed-in person may open. */
export async function pageUser() {
  try {
    return await requireUser();
  } catch (e) {
    signInFirst(e);
    throw e;
  }
}

/**
 * For pages: the access checks throw AppError like the API does; on a page, "not yours" shows the framework's
 * not-found page instead of a crash (a non-member learns nothing about what exists).
 */
export async function orNotFound<T>(access: Promise<T>, codes: ErrorCode[] = ["not_found"]): Promise<T> {
  try {
    return await access;
  } catch (e) {
    signInFirst(e);
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
    signInFirst(e);
    if (e instanceof AppError && e.code === "not_found") notFound();
    if (e instanceof AppError && e.code === "forbidden") forbidden();
    throw e;
  }
}
