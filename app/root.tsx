// Must stay the first import: it configures zod before any schema module is evaluated.
import "./platform/zod-browser";
import { Links, Meta, Outlet, Scripts, ScrollRestoration, useRouteLoaderData } from "react-router";
import fontRegular from "@fontsource/inter-tight/latin-400.css?url";
import fontMedium from "@fontsource/inter-tight/latin-500.css?url";
import fontSemibold from "@fontsource/inter-tight/latin-600.css?url";
import fontBold from "@fontsource/inter-tight/latin-700.css?url";
import type { Route } from "./+types/root";
import { userContext } from "./accounts/context";
import stylesheet from "./app.css?url";
import { loadUser, requestGuard } from "./platform/middleware.server";
import { useNonce } from "./platform/nonce";
import { ErrorPage } from "./ui/error-page";
import { useShipsScripts } from "./ui/plain-page";
import { Shell } from "./ui/shell";

export const middleware: Route.MiddlewareFunction[] = [requestGuard, loadUser];

export const links: Route.LinksFunction = () => [
  { rel: "icon", href: "/favicon.svg", type: "image/svg+xml" },
  ...[fontRegular, fontMedium, fontSemibold, fontBold].map((href) => ({ rel: "stylesheet", href })),
  { rel: "stylesheet", href: stylesheet },
];

export async function loader({ context }: Route.LoaderArgs) {
  return { user: context.get(userContext) };
}

export function Layout({ children }: { children: React.ReactNode }) {
  const nonce = useNonce();
  const scripts = useShipsScripts();
  return (
    <html lang="en-ZA">
      <head>
        <meta charSet="utf-8" />
        <meta name="viewport" content="width=device-width, initial-scale=1" />
        <Meta />
        <Links />
      </head>
      <body className="font-sans">
        {children}
        {scripts ? (
          <>
            <ScrollRestoration nonce={nonce} />
            <Scripts nonce={nonce} />
          </>
        ) : null}
      </body>
    </html>
  );
}

export default function App({ loaderData }: Route.ComponentProps) {
  return (
    <Shell user={loaderData.user}>
      <Outlet />
    </Shell>
  );
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  const root = useRouteLoaderData<typeof loader>("root");
  return (
    <Shell user={root?.user ?? null}>
      <ErrorPage error={error} />
    </Shell>
  );
}
