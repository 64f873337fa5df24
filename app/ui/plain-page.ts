// Pages that work as plain HTML forms ship no script at all: the sign-in door is the first thing a plumber opens
// on a slow site connection, and it needs nothing but a form post. Such a route exports
// `export const handle = PLAIN_PAGE;` and the document then leaves out the hydration scripts; its forms post and
// redirect the way any web form does, and every check happens on the server as it always does.
import { useMatches } from "react-router";

export const PLAIN_PAGE = { scripts: false } as const;

/** False when any route on the page asked for a plain page. */
export function useShipsScripts() {
  return !useMatches().some((m) => (m.handle as { scripts?: boolean } | undefined)?.scripts === false);
}
