// Routing convention, stated once: flat file routes under app/routes; server-only and test modules are not routes.
import type { RouteConfig } from "@react-router/dev/routes";
import { flatRoutes } from "@react-router/fs-routes";

export default flatRoutes({ ignoredRouteFiles: ["**/*.server.*", "**/*.test.*"] }) satisfies RouteConfig;
