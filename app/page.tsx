import { redirect } from "next/navigation";
import { getCurrentUser } from "@/lib/auth/guard";
import { homeFor } from "@/components/shell/nav-links";

export default async function Home() {
  const user = await getCurrentUser();
  if (!user) redirect("/sign-in");
  redirect(homeFor(user.role));
}
