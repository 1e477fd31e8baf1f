import "server-only";
/**
 * The server-action wrapper for forms used with React's useActionState:
 * parses FormData with a zod schema, runs the action (which authorises first),
 * and returns a plain state with a message and per-field errors instead of
 * throwing. Next's redirect/notFound signals pass through untouched.
 */
import { unstable_rethrow } from "next/navigation";
import { z } from "zod";
import { DomainError } from "@/lib/errors";
import { describeZodError } from "./errors";

export type ActionState = {
  status: "idle" | "ok" | "error";
  message?: string;
  fieldErrors?: Record<string, string>;
  /** What was submitted (secrets left out), so a failed form can show it again. */
  values?: Record<string, string | string[]>;
};

const SECRET_FIELD = /password|confirm|token|secret/i;

/** Submitted text fields minus secrets, for redisplay after an error. */
export function echoValues(input: Record<string, unknown>): Record<string, string | string[]> {
  const out: Record<string, string | string[]> = {};
  for (const [k, v] of Object.entries(input)) {
    if (SECRET_FIELD.test(k)) continue;
    if (typeof v === "string") out[k] = v.slice(0, 1000);
    else if (Array.isArray(v)) out[k] = v.filter((x): x is string => typeof x === "string").map((x) => x.slice(0, 1000));
  }
  return out;
}

export const idleState: ActionState = { status: "idle" };

/** FormData → plain object; repeated keys (checkbox groups) become arrays when the key ends in []. */
export function formDataToObject(form: FormData): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [key, value] of form.entries()) {
    if (key.startsWith("$ACTION")) continue;
    if (key.endsWith("[]")) {
      const k = key.slice(0, -2);
      const list = (out[k] as unknown[] | undefined) ?? [];
      list.push(value);
      out[k] = list;
    } else out[key] = value;
  }
  return out;
}

/**
 * Makes a form action. `run` receives the parsed input; return a success
 * message (or call redirect()). DomainErrors become {status:"error", message}.
 */
export function formAction<S extends z.ZodType>(
  schema: S,
  run: (input: z.output<S>) => Promise<string | void>,
): (prev: ActionState, form: FormData) => Promise<ActionState> {
  return async (_prev, form) => {
    const raw = formDataToObject(form);
    try {
      const parsed = schema.safeParse(raw);
      if (!parsed.success) {
        const { message, fields } = describeZodError(parsed.error);
        const onlyForm = Object.keys(fields).every((k) => k === "_");
        return { status: "error", message: onlyForm ? message : "Some fields need attention; see the messages below them.", fieldErrors: fields, values: echoValues(raw) };
      }
      const message = await run(parsed.data);
      return { status: "ok", message: message ?? "Saved." };
    } catch (err) {
      unstable_rethrow(err);
      if (err instanceof DomainError) return { status: "error", message: err.message, values: echoValues(raw) };
      console.error("Unexpected error in a server action:", err);
      return { status: "error", message: "Something went wrong on our side. Try again; if it keeps happening, tell your admin.", values: echoValues(raw) };
    }
  };
}
