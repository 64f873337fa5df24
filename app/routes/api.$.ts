// Any other /api/ path: a JSON 404, never an HTML page.
import { apiError } from "~/platform/http.server";

export async function loader() {
  return apiError(404, "No such API endpoint.");
}

export async function action() {
  return apiError(404, "No such API endpoint.");
}
