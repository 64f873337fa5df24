import { data } from "react-router";
import type { Route } from "./+types/$";

export async function loader() {
  throw data({ message: "This page does not exist, or it has moved." }, { status: 404 });
}

export default function NotFound() {
  return null;
}

export const meta: Route.MetaFunction = () => [{ title: "Not found · Countersign" }];
