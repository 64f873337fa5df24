// The one error page: a message per status, in plain words, with the way back.
import { isRouteErrorResponse, Link } from "react-router";
import { AlertIcon } from "./icons";

const MESSAGES: Record<number, { title: string; text: string }> = {
  400: { title: "That request was not understood", text: "Something in it was missing or malformed. Go back and try again." },
  401: { title: "Sign in first", text: "You need to be signed in to see this." },
  403: { title: "Not open to you", text: "Your account does not have access to this." },
  404: { title: "Nothing here", text: "This page does not exist, or it has moved." },
  413: { title: "Too large", text: "What you sent is larger than Countersign accepts." },
  429: { title: "Slow down", text: "Too many attempts in a short time. Wait a few minutes and try again." },
  503: { title: "Countersign is catching its breath", text: "A service it depends on is not answering. Nothing you sent was saved. Try again in a minute." },
};

export function ErrorPage({ error }: { error: unknown }) {
  let status = 500;
  let detail: string | undefined;
  if (isRouteErrorResponse(error)) {
    status = error.status;
    detail = typeof error.data === "object" && error.data && "message" in error.data ? String(error.data.message) : undefined;
  }
  const known = MESSAGES[status] ?? { title: "Something went wrong", text: "An unexpected error stopped this page. It has been logged." };
  return (
    <div className="mx-auto max-w-xl rounded-lg border border-rule bg-sheet p-8 shadow-sm" role="alert">
      <p className="flex items-center gap-2 text-sm font-semibold uppercase tracking-wider text-copper">
        <AlertIcon /> Error {status}
      </p>
      <h1 className="mt-2 text-2xl font-bold">{known.title}</h1>
      <p className="mt-3 text-ink-soft">{detail ?? known.text}</p>
      <p className="mt-6 flex gap-4 text-sm font-semibold">
        <Link to="/projects" className="text-copper-deep underline underline-offset-4">My projects</Link>
        <Link to="/" className="text-copper-deep underline underline-offset-4">Start page</Link>
      </p>
    </div>
  );
}
