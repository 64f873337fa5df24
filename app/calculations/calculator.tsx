// A calculator page body: the input editor, results recomputed in the browser as you type (the same engine the
// server saves with), the engine's problems beside the fields, and — for roles that may — the save form.
import { getFormProps, useForm, type SubmissionResult } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { useMemo, useReducer } from "react";
import { Form, useNavigation } from "react-router";
import { CAUTION } from "~/engineering";
import { Button } from "~/ui/button";
import { FormErrors, TextField } from "~/ui/form";
import { Panel } from "~/ui/shell";
import { BalanceResults } from "./balance-results";
import { FORMS, labelFor } from "./forms";
import { InputForm } from "./input-form";
import { issuesByPath, type InputIssue } from "./issues";
import { KIND_DEFINITIONS, runCalculation, type BalanceInput, type CalculationKind } from "./kinds";
import { NetworkEditor } from "./network-editor";
import { networkReducer, type NetworkAction } from "./network-state";
import { saveFormSchema } from "./schemas";
import { Caution, FiguresTable, FindingsList, IssueList, VerdictBadge } from "./ui";
import { useDebounced } from "./use-debounced";

interface Props {
  kind: CalculationKind;
  initialInput: unknown;
  canSave: boolean;
  defaultTitle: string;
  saveLabel: string;
  lastResult?: SubmissionResult<string[]> | null;
  serverIssues?: InputIssue[];
}

export function Calculator({ kind, initialInput, canSave, defaultTitle, saveLabel, lastResult, serverIssues = [] }: Props) {
  const def = KIND_DEFINITIONS[kind];
  const [input, dispatch] = useReducer((state: any, action: NetworkAction) => (kind === "balance" ? networkReducer(state, action) : action.type === "replace" ? action.input : state), initialInput);
  const settled = useDebounced(input, 200);
  const run = useMemo(() => runCalculation(kind, settled), [kind, settled]);
  const issues = run.ok ? [] : run.issues;
  const errors = useMemo(() => issuesByPath(issues), [issues]);
  const describe = (i: InputIssue) => {
    const label = kind === "balance" ? undefined : labelFor(kind, i.path);
    return label && !i.message.startsWith(label) ? `${label}: ${i.message}` : i.message;
  };

  return (
    <div className="space-y-6">
      <Panel>
        <h2 className="mb-4 text-lg font-bold">Inputs</h2>
        {kind === "balance" ? (
          <NetworkEditor input={input as BalanceInput} dispatch={dispatch} issues={issues} errors={errors} />
        ) : (
          <InputForm sections={FORMS[kind]} value={input} onChange={(next) => dispatch({ type: "replace", input: next })} errors={errors} />
        )}
      </Panel>

      <Panel>
        <div className="mb-4 flex flex-wrap items-center gap-3" aria-live="polite">
          <h2 className="text-lg font-bold">Results</h2>
          {run.ok && def.hasVerdict ? <VerdictBadge ok={run.output.ok} passLabel="Passes" failLabel="Fails" /> : null}
          {input !== settled ? <span className="text-xs text-ink-soft">Updating…</span> : null}
        </div>
        <div className="space-y-6" data-testid="results">
          {run.ok ? (
            <>
              {kind === "balance" ? <BalanceResults result={run.output} onApply={dispatch} /> : <FiguresTable figures={def.figures(run.input, run.output)} />}
              <section>
                <h3 className="mb-2 text-base font-bold">Findings</h3>
                <FindingsList findings={run.output.findings} />
              </section>
            </>
          ) : (
            <IssueList issues={issues} describe={describe} />
          )}
          {/* While the input has problems there is no result to take the caution from: show the engine's own text. */}
          <Caution text={run.ok ? run.output.caution : CAUTION} />
        </div>
      </Panel>

      {canSave ? (
        <SaveForm input={input} defaultTitle={defaultTitle} saveLabel={saveLabel} lastResult={lastResult} serverIssues={serverIssues} blocked={!run.ok} />
      ) : (
        <p className="text-sm text-ink-soft">Your role on this project can run calculations but not save them; an engineer saves the calculations an approval rests on.</p>
      )}
    </div>
  );
}

function SaveForm({ input, defaultTitle, saveLabel, lastResult, serverIssues, blocked }: {
  input: unknown; defaultTitle: string; saveLabel: string; lastResult?: SubmissionResult<string[]> | null; serverIssues: InputIssue[]; blocked: boolean;
}) {
  const navigation = useNavigation();
  const [form, fields] = useForm({
    lastResult,
    defaultValue: { title: defaultTitle },
    shouldValidate: "onBlur",
    shouldRevalidate: "onInput",
    onValidate: ({ formData }) => parseWithZod(formData, { schema: saveFormSchema }),
  });
  return (
    <Panel>
      <Form method="post" {...getFormProps(form)} className="flex flex-wrap items-end gap-4">
        <input type="hidden" name="intent" value="save" />
        <input type="hidden" name="inputs" value={JSON.stringify(input)} />
        <div className="min-w-[16rem] flex-1">
          <TextField meta={fields.title} label="Title" hint="Say what this calculation shows, e.g. the unit and the option." />
        </div>
        <Button type="submit" disabled={blocked || navigation.state === "submitting"}>{saveLabel}</Button>
        <div className="w-full space-y-2">
          <FormErrors errors={form.errors} id={form.errorId} />
          {serverIssues.length ? <IssueList issues={serverIssues} /> : null}
          {blocked ? <p className="text-sm text-ink-soft">Fix the inputs above before saving.</p> : null}
        </div>
      </Form>
    </Panel>
  );
}
