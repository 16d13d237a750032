import { redirect } from "next/navigation";
import { currentSession } from "@/lib/server/auth";

export default async function Home() {
  redirect((await currentSession()) ? "/projects" : "/signin");
}
