import Link from "next/link";
import { Wordmark } from "@/components/ui/logo";

export default function NotFound() {
  return (
    <main id="main" className="mx-auto max-w-xl px-4 py-16">
      <Wordmark />
      <div className="panel mt-8 p-8">
        <h1 className="text-xl font-semibold">Nothing here</h1>
        <p className="mt-2 text-ink-700">This address does not lead to a page. Check the link, or go back to your workspace.</p>
        <Link className="btn-quiet mt-6" href="/">
          Go to my workspace
        </Link>
      </div>
    </main>
  );
}
