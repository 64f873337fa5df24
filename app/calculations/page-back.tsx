// The way back to the project's calculations, at the top of every calculator page.
import { Link } from "react-router";

export function PageBack({ projectId }: { projectId: string }) {
  return (
    <p className="text-sm">
      <Link to={`/projects/${projectId}/calculations`} className="underline underline-offset-4">All calculations</Link>
    </p>
  );
}
