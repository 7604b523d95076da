import { redirect } from "next/navigation";
import { currentSession } from "@/lib/auth/guard";
import { homeFor } from "@/components/shell/nav-links";

export default async function Home() {
  const { user, ended } = await currentSession();
  if (!user) redirect(ended === "lifetime" ? "/sign-in?ended=lifetime" : "/sign-in");
  redirect(homeFor(user.role));
}
