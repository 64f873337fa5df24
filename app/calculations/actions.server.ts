// The save action behind the calculator pages: the Conform-parsed form, then the same service the API uses, so
// the server recomputes from the inputs and never stores what the browser computed.
import { parseWithZod } from "@conform-to/zod/v4";
import { data, redirect, type RouterContextProvider } from "react-router";
import { requireProjectAction } from "../projects/projects.server";
import { CalculationError, saveCalculation } from "./calculations.server";
import type { CalculationKind } from "./kinds";
import { saveFormSchema } from "./schemas";

export async function saveFromForm(context: Readonly<RouterContextProvider>, request: Request, kind: CalculationKind) {
  const { project, user } = requireProjectAction(context, request, "calculations.save");
  const submission = parseWithZod(await request.formData(), { schema: saveFormSchema });
  if (submission.status !== "success") return data({ result: submission.reply(), issues: [] }, { status: 400 });
  let inputs: unknown;
  try {
    inputs = JSON.parse(submission.value.inputs);
  } catch {
    return data({ result: submission.reply({ formErrors: ["The inputs could not be read; reload the page and try again."] }), issues: [] }, { status: 400 });
  }
  try {
    const saved = await saveCalculation(project.id, user.id, { kind, title: submission.value.title, inputs });
    return redirect(`/projects/${project.id}/calculations/${saved.id}?saved=1`);
  } catch (error) {
    if (!(error instanceof CalculationError) || error.status !== 422) throw error;
    const inputIssues = error.issues.filter((i) => i.path[0] === "inputs").map((i) => ({ ...i, path: i.path.slice(1) }));
    const titleErrors = error.issues.filter((i) => i.path[0] === "title").map((i) => i.message);
    return data(
      { result: submission.reply({ formErrors: inputIssues.length ? [error.message] : [], fieldErrors: titleErrors.length ? { title: titleErrors } : {} }), issues: inputIssues },
      { status: 422 },
    );
  }
}
