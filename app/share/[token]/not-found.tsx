import { Wordmark } from "@/components/ui/logo";

export default function ShareLinkNotFound() {
  return (
    <main id="main" className="mx-auto max-w-xl px-4 py-16">
      <Wordmark />
      <div className="panel mt-8 p-8">
        <h1 className="text-xl font-semibold">This link does not work</h1>
        <p className="mt-2 text-ink-700">
          The share link may have expired, been withdrawn by the team that sent it, or been copied only in part. Ask the sender for a new link.
        </p>
      </div>
    </main>
  );
}
