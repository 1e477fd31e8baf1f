import Link from "next/link";

/** Shown in place of a page the signed-in member may not open (the server refused; nothing was loaded). */
export function AccessDenied({ message, homeHref = "/" }: { message: string; homeHref?: string }) {
  return (
    <div className="panel mx-auto mt-10 max-w-lg p-8" role="alert">
      <p className="text-sm font-semibold uppercase tracking-wide text-halt-800">Not available to you</p>
      <h1 className="mt-1 text-xl font-semibold text-ink-900">You can’t open this page</h1>
      <p className="mt-2 text-ink-700">{message}</p>
      <p className="mt-4 text-sm text-ink-600">If you think you need access, ask an admin of the workspace to change your roles.</p>
      <Link href={homeHref} className="btn-quiet mt-6">
        Go to my workspace
      </Link>
    </div>
  );
}
