import { redirect } from "react-router";
import type { Route } from "./+types/sign-out";
import { endSession } from "~/accounts/session.server";

export async function loader() {
  return redirect("/");
}

export async function action({ request }: Route.ActionArgs) {
  return endSession(request, "/sign-in");
}
