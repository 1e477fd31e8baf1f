import type { Metadata } from "next";
import { Wordmark } from "@/components/ui/logo";
import { SignOutButton } from "@/components/shell/sign-out-button";
import { requirePageUser } from "@/lib/auth/page";

export const metadata: Metadata = { title: "No workspace yet" };

/** For a signed-in person who belongs to no workspace (e.g. after being removed). */
export default async function WelcomePage() {
  const user = await requirePageUser("/welcome");
  return (
    <main id="main" className="mx-auto max-w-xl px-4 py-16">
      <Wordmark />
      <div className="panel mt-8 p-8">
        <h1 className="text-xl font-semibold">You are not in any workspace</h1>
        <p className="mt-2 text-ink-700">
          {user.name}, your account ({user.email}) is not a member of any Stokeline workspace. Ask an admin of your team to invite you; the
          invitation e-mail has a link that adds you.
        </p>
        <div className="mt-6">
          <SignOutButton />
        </div>
      </div>
    </main>
  );
}
