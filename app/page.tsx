import { redirect } from "next/navigation";
import { listWorkspacesForUser } from "@/db/queries/workspaces";
import { requirePageUser } from "@/lib/auth/page";

/** The front door: signed-out → sign-in; otherwise the member's first workspace. */
export default async function Home() {
  const user = await requirePageUser("/");
  const workspaces = await listWorkspacesForUser(user.id);
  redirect(workspaces.length > 0 ? `/w/${workspaces[0].slug}` : "/welcome");
}
