import type { Route } from "./+types/requests._index";
import { requireUser } from "~/accounts/auth.server";
import { listRequests, readFilter } from "~/requests/lists.server";
import { RequestTable } from "~/requests/request-table";
import { PageTitle } from "~/ui/shell";

export async function loader({ context, request }: Route.LoaderArgs) {
  const user = requireUser(context, request);
  const filter = readFilter(new URL(request.url));
  return { list: await listRequests(user, filter), filter, me: user.id };
}

export default function MyRequests({ loaderData }: Route.ComponentProps) {
  return (
    <div>
      <PageTitle title="Requests" lead="Deviation requests across your projects. Whatever waits for you comes first." />
      <RequestTable list={loaderData.list} filter={loaderData.filter} showProject me={loaderData.me} />
    </div>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Requests · Countersign" }];
