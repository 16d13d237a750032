"use client";
/**
 * The plan editor: one react-hook-form form over the whole scenario definition (validated by the engine's zod
 * schema), six sections switched client-side so edits survive, an explicit save that runs `parseScenario`
 * first, server field problems shown the same way, and a conflict screen on 409. Nothing saves on its own.
 */
import { useEffect, useState } from "react";
import { useRouter } from "next/navigation";
import { FormProvider, useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { useQueryClient } from "@tanstack/react-query";
import { scenarioSchema, type FieldProblem, type Scenario, type ScenarioInput } from "@sim/schema";
import { parseScenario } from "@sim/validate";
import { api, ApiError } from "@/lib/api-client";
import { can, ROLE_LABELS } from "@/lib/permissions";
import { CalendarSection } from "./calendar-section";
import { ConflictDialog } from "./conflict-dialog";
import { CrewsSection } from "./crews-section";
import { n } from "./fields";
import { sectionOf, toFormPath, toFormValues, type SectionId } from "./plan-logic";
import { describeProblemPath, plainMessage } from "./problem-labels";
import { SaveBar } from "./save-bar";
import { SequenceSection } from "./sequence-section";
import { StagesSection } from "./stages-section";
import type { ScenarioAnswer, ScenarioConflict, ScenarioRecord, ScenarioSavedAnswer } from "@/lib/scenario-contract";
import { TrafficSection } from "./traffic-section";
import { WeatherSection } from "./weather-section";
import { useLeaveGuard } from "./use-leave-guard";

const SECTIONS: { id: SectionId; label: string; hint: string }[] = [
  { id: "sequence", label: "Sequence", hint: "Operations and links" },
  { id: "stages", label: "Stages", hint: "Lanes, stretches, barrier" },
  { id: "crews", label: "Crews and rates", hint: "Rates, crews, gates" },
  { id: "calendar", label: "Calendar and closures", hint: "Shifts, closures, seasons" },
  { id: "weather", label: "Weather", hint: "Climate profile" },
  { id: "traffic", label: "Traffic and costs", hint: "Demand, capacity, costs" },
];

function initialValues(s: ScenarioRecord): ScenarioInput {
  const v = toFormValues(s.definition);
  return { ...v, name: s.name, description: s.description ?? v.description ?? "" };
}

export function PlanForm({ data, onReload }: { data: ScenarioAnswer; onReload: () => Promise<void> }) {
  const { scenario, role, archived, revisions } = data;
  const canEdit = can(role, "editScenario", archived);
  const readOnly = !canEdit;
  const router = useRouter();
  const queryClient = useQueryClient();
  const [initial] = useState(() => initialValues(scenario));
  const methods = useForm<ScenarioInput, unknown, Scenario>({ resolver: zodResolver(scenarioSchema), defaultValues: initial, mode: "onChange" });
  const { getValues, reset, setError, clearErrors, formState } = methods;
  const dirty = formState.isDirty;

  const [section, setSection] = useState<SectionId>("sequence");
  const [loadedVersion, setLoadedVersion] = useState(scenario.version);
  const [changeNote, setChangeNote] = useState("");
  const [problems, setProblems] = useState<{ source: "check" | "server"; list: FieldProblem[] } | null>(null);
  const [pendingFocus, setPendingFocus] = useState<string | null>(null);
  const [saving, setSaving] = useState(false);
  const [status, setStatus] = useState<{ bad: boolean; text: string } | null>(null);
  const [conflict, setConflict] = useState<{ theirs: ScenarioRecord; mine: unknown } | null>(null);

  useLeaveGuard(dirty && canEdit);

  useEffect(() => {
    if (!pendingFocus) return;
    // A problem may name a part of a field (`shifts.0`) or a whole row (`operations.2`): focus the nearest input.
    let el: HTMLElement | null = null;
    for (let path = pendingFocus; path && !el; path = path.includes(".") ? path.slice(0, path.lastIndexOf(".")) : "") {
      el = document.getElementById(path) ?? document.querySelector<HTMLElement>(`[id^="${CSS.escape(path)}."], [id^="${CSS.escape(path)}-"]`);
    }
    if (el) {
      el.scrollIntoView({ block: "center" });
      el.focus();
    }
    setPendingFocus(null);
  }, [pendingFocus, section]);

  const jumpTo = (path: string) => {
    setSection(sectionOf(path));
    setPendingFocus(toFormPath(path));
  };

  const showProblems = (source: "check" | "server", list: FieldProblem[]) => {
    setProblems({ source, list });
    clearErrors();
    const values = getValues();
    for (const p of list) setError(n(toFormPath(p.path)), { type: source, message: plainMessage(p.message, values) });
    if (list[0]) jumpTo(list[0].path);
  };

  const save = async (version: number) => {
    setStatus(null);
    // A deep copy: getValues() shares nested objects with the live form, which may change while the request runs.
    const values = structuredClone(getValues());
    const parsed = parseScenario(values);
    if (!parsed.ok) {
      setConflict(null);
      showProblems("check", parsed.problems);
      setStatus({ bad: true, text: `Not saved: ${parsed.problems.length} problem${parsed.problems.length === 1 ? "" : "s"} to fix first.` });
      return;
    }
    setSaving(true);
    try {
      const def = parsed.scenario;
      const res = await api<ScenarioSavedAnswer>(`/api/scenarios/${scenario.id}`, {
        method: "PUT",
        body: { name: def.name, description: def.description, definition: def, version, changeNote: changeNote.trim() },
      });
      reset(values, { keepValues: true }); // edits typed while the request ran stay unsaved, and dirty
      setLoadedVersion(res.version);
      setChangeNote("");
      setProblems(null);
      setConflict(null);
      setStatus({ bad: false, text: `Saved as version ${res.version}.` });
      await queryClient.invalidateQueries({ queryKey: ["scenarios", scenario.id] });
      router.refresh(); // the header above shows the version too
    } catch (e) {
      const theirs = e instanceof ApiError && e.status === 409 ? (e.body as ScenarioConflict).current : null;
      if (theirs) {
        setConflict({ theirs, mine: values });
      } else if (e instanceof ApiError && e.status === 400 && e.fields.length) {
        setConflict(null);
        showProblems("server", e.fields);
        setStatus({ bad: true, text: e.message });
      } else {
        setConflict(null);
        setStatus({ bad: true, text: e instanceof Error ? `Not saved: ${e.message}` : "Not saved." });
      }
    } finally {
      setSaving(false);
    }
  };

  const counts = new Map<SectionId, number>();
  for (const p of problems?.list ?? []) counts.set(sectionOf(p.path), (counts.get(sectionOf(p.path)) ?? 0) + 1);

  return (
    <FormProvider {...methods}>
      <div className="space-y-5 pb-4">
        {readOnly && (
          <p className="rounded-md border border-line bg-white px-4 py-3 text-sm" role="note">
            {archived
              ? "Read-only: the project is archived, so its plans cannot be changed until an administrator restores it."
              : `Read-only: as ${ROLE_LABELS[role] ?? role} you can view this plan; engineers, schedulers and administrators edit it.`}
          </p>
        )}
        <div className="grid gap-5 lg:grid-cols-[13rem_minmax(0,1fr)]">
          <nav aria-label="Plan sections">
            <ul className="flex flex-wrap gap-2 lg:flex-col">
              {SECTIONS.map((s) => {
                const active = s.id === section;
                const count = counts.get(s.id) ?? 0;
                return (
                  <li key={s.id}>
                    <button
                      type="button"
                      data-testid={`section-${s.id}`}
                      aria-current={active ? "step" : undefined}
                      onClick={() => setSection(s.id)}
                      className={`w-full rounded-md border px-3 py-2 text-left text-sm ${active ? "border-brand-600 bg-brand-50 text-brand-800" : "border-line bg-white hover:bg-brand-50"}`}
                    >
                      <span className="flex items-center justify-between gap-2 font-medium">
                        {s.label}
                        {count > 0 && (
                          <span className="badge bg-bad-bg text-bad">
                            {count}
                            <span className="sr-only"> problem{count === 1 ? "" : "s"}</span>
                          </span>
                        )}
                      </span>
                      <span className="hidden text-xs text-muted lg:block">{s.hint}</span>
                    </button>
                  </li>
                );
              })}
            </ul>
          </nav>

          <form noValidate onSubmit={(e) => e.preventDefault()} aria-label="Scenario plan" className="min-w-0 space-y-5">
            {problems && problems.list.length > 0 && (
              <section className="card border-bad/40" role="alert" aria-labelledby="problems-heading" data-testid="plan-problems">
                <h2 id="problems-heading" className="text-bad">
                  {problems.source === "server" ? "Not saved: the server found these problems (select one to go to the field)" : "Fix these before saving (select one to go to the field)"}
                </h2>
                <ul className="mt-2 space-y-1 text-sm">
                  {problems.list.map((p, i) => {
                    // Named as people see it: section, row and label; the button takes them to the field.
                    const where = describeProblemPath(p.path, getValues());
                    return (
                      <li key={`${p.path}-${i}`}>
                        <button type="button" className="text-left hover:underline" onClick={() => jumpTo(p.path)} data-problem-path={toFormPath(p.path)}>
                          <span className="text-muted">{where.sectionLabel}:</span> <span className="font-semibold text-ink">{where.field}</span> — {plainMessage(p.message, getValues())}
                        </button>
                      </li>
                    );
                  })}
                </ul>
              </section>
            )}
            <fieldset disabled={readOnly} className={readOnly ? "plan-readonly min-w-0" : "min-w-0"}>
              <legend className="sr-only">{SECTIONS.find((s) => s.id === section)?.label}</legend>
              {section === "sequence" && <SequenceSection readOnly={readOnly} />}
              {section === "stages" && <StagesSection readOnly={readOnly} />}
              {section === "crews" && <CrewsSection />}
              {section === "calendar" && <CalendarSection readOnly={readOnly} />}
              {section === "weather" && <WeatherSection />}
              {section === "traffic" && <TrafficSection readOnly={readOnly} />}
            </fieldset>
          </form>
        </div>

        <SaveBar
          canEdit={canEdit}
          dirty={dirty}
          saving={saving}
          changeNote={changeNote}
          onChangeNote={setChangeNote}
          onSave={() => save(loadedVersion)}
          status={status}
          scenario={scenario}
          revisions={revisions}
        />
      </div>
      {conflict && (
        <ConflictDialog
          theirs={conflict.theirs}
          mine={conflict.mine}
          loadedVersion={loadedVersion}
          busy={saving}
          onCancel={() => setConflict(null)}
          onSaveMine={() => save(conflict.theirs.version)}
          onKeepTheirs={async () => {
            reset(getValues()); // the leave guard must not ask about edits the user chose to drop
            setConflict(null);
            await onReload();
          }}
        />
      )}
    </FormProvider>
  );
}
