import { apiError } from "~/.server/platform/http/api-error.server";

export function loader() {
  return apiError(404, "not-found", "No such API endpoint.");
}

export function action() {
  return apiError(404, "not-found", "No such API endpoint.");
}
