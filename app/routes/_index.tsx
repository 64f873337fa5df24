import { redirect } from "react-router";
import type { Route } from "./+types/_index";
import { optionalUser } from "~/accounts/auth.server";
import { ButtonLink } from "~/ui/button";
import { ClipboardIcon, CompassIcon, SquareIcon, WrenchIcon } from "~/ui/icons";

export async function loader({ context }: Route.LoaderArgs) {
  if (optionalUser(context)) throw redirect("/projects");
  return null;
}

const STEPS = [
  { Icon: WrenchIcon, who: "Site plumber", what: "Finds that a provision cannot be applied on site and raises a request against the drawing: clause, constraint, proposal, measurements, photos, a pin on the sheet." },
  { Icon: CompassIcon, who: "Engineer", what: "Marks up the sheet, runs the hydraulic checks, records a decision against every safety principle and signs a versioned approval." },
  { Icon: SquareIcon, who: "Architect", what: "Keeps the drawing register and sees what changed between revisions, and which approvals rest on which." },
  { Icon: ClipboardIcon, who: "Site team", what: "Retrieves the signed, stamped drawings and the record behind the certificate of compliance." },
];

export default function Home() {
  return (
    <div className="space-y-12">
      <section className="max-w-3xl">
        <p className="text-sm font-semibold uppercase tracking-widest text-copper">Rational designs, on record</p>
        <h1 className="mt-3 text-4xl font-bold leading-tight tracking-tight sm:text-5xl">
          When the standard can't be applied on site, get the engineer's answer on the drawing — signed.
        </h1>
        <p className="mt-5 text-lg text-ink-soft">
          Countersign is the shared workspace for hot-water storage installations that need a deviation from the
          deemed-to-satisfy provisions: the request, the review, the checks and the signed approval, in one place.
        </p>
        <div className="mt-8 flex flex-wrap gap-3">
          <ButtonLink to="/sign-in">Sign in</ButtonLink>
          <ButtonLink to="/sign-up" variant="quiet">Create an account</ButtonLink>
        </div>
      </section>
      <ol className="grid gap-4 sm:grid-cols-2">
        {STEPS.map(({ Icon, who, what }, i) => (
          <li key={who} className="rounded-lg border border-rule bg-sheet p-5">
            <p className="flex items-center gap-2 font-semibold"><span className="text-ink-soft">{i + 1}.</span><Icon className="text-copper" /> {who}</p>
            <p className="mt-2 text-sm text-ink-soft">{what}</p>
          </li>
        ))}
      </ol>
    </div>
  );
}

export const meta: Route.MetaFunction = () => [
  { title: "Countersign — rational designs for hot-water installations" },
  { name: "description", content: "Deviation requests, engineering review and signed approvals for hot-water storage installations." },
];
