// The project details form, used to start a project and to edit it.
import { getFormProps, useForm, type SubmissionResult } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { Form, useNavigation } from "react-router";
import { Button } from "../ui/button";
import { FormErrors, TextArea, TextField } from "../ui/form";
import { projectSchema } from "./schemas";

export function ProjectForm({ lastResult, defaultValue, submitLabel }: {
  lastResult?: SubmissionResult<string[]> | null;
  defaultValue?: Record<string, string>;
  submitLabel: string;
}) {
  const navigation = useNavigation();
  const [form, fields] = useForm({
    lastResult,
    defaultValue,
    shouldValidate: "onBlur",
    shouldRevalidate: "onInput",
    onValidate: ({ formData }) => parseWithZod(formData, { schema: projectSchema }),
  });
  return (
    <Form method="post" {...getFormProps(form)} className="space-y-4">
      <FormErrors errors={form.errors} id={form.errorId} />
      <TextField meta={fields.name} label="Project name" />
      <TextField meta={fields.siteAddress} label="Site address" autoComplete="street-address" />
      <TextField meta={fields.clientName} label="Client / owner (optional)" />
      <TextArea meta={fields.description} label="Description (optional)" hint="What is being built, and anything the team should know." />
      <Button type="submit" disabled={navigation.state === "submitting"}>{submitLabel}</Button>
    </Form>
  );
}
