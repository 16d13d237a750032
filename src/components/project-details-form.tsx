"use client";
/**
 * A project's details — starting a project, or editing one's — on the shared request contract
 * (`projectDetailsSchema`) with react-hook-form; problems beside their fields, the server's too.
 */
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm, type UseFormRegisterReturn } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { useMutation } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { applyServerErrors } from "@/lib/form-errors";
import { projectDetailsSchema } from "@/lib/schemas";
import type { ProjectSavedAnswer } from "@/lib/project-contract";
import { LIMITS } from "@sim/limits";
import { formatStation } from "@/lib/format";
import { describedBy, LabelledField as Field } from "@/components/labelled-field";
import { FormFailure, SubmitRow } from "@/components/form-footer";

type Input = z.input<typeof projectDetailsSchema>;
type Output = z.output<typeof projectDetailsSchema>;
const FIELDS = ["name", "structureName", "region", "deckLengthFt", "startStationFt", "lanes", "description"] as const;
type FieldName = (typeof FIELDS)[number];

/** A stored project's details as the form shows them: the station in station notation, the lanes as one line. */
export interface ProjectDetails extends Output {
  id: string;
}

function formValues(p: ProjectDetails): Input {
  return {
    name: p.name,
    structureName: p.structureName,
    region: p.region,
    deckLengthFt: p.deckLengthFt,
    // Station notation keeps whole feet exactly; a fractional station stays in feet so saving it again changes nothing.
    startStationFt: Number.isInteger(p.startStationFt) ? formatStation(p.startStationFt) : String(p.startStationFt),
    lanes: p.lanes.join(", "),
    description: p.description,
  };
}

/** Without `project`: starts one and opens its page. With it: saves its details in place. */
export function ProjectDetailsForm({ project }: { project?: ProjectDetails }) {
  const router = useRouter();
  const { register, handleSubmit, formState, setError, reset } = useForm<Input, unknown, Output>({
    resolver: zodResolver(projectDetailsSchema),
    defaultValues: project ? formValues(project) : { name: "", structureName: "", region: "", startStationFt: "0+00", lanes: "L1, L2", description: "" },
  });
  const [failure, setFailure] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);
  const save = useMutation({
    mutationFn: (v: Output) =>
      project ? api<ProjectSavedAnswer>(`/api/projects/${project.id}`, { method: "PUT", body: v }) : api<ProjectSavedAnswer>("/api/projects", { method: "POST", body: v }),
    onSuccess: (r, v) => {
      if (!project) {
        // The project's page: it has no scenario yet and offers New scenario, whose standard template takes this deck.
        router.push(`/projects/${r.id}`);
        return;
      }
      reset(formValues({ ...v, id: project.id }));
      setSaved(true);
      router.refresh();
    },
    onError: (e) => setFailure(applyServerErrors(e, setError, (p) => ((FIELDS as readonly string[]).includes(p) ? (p as FieldName) : null))),
  });
  const problem = (f: FieldName) => formState.errors[f]?.message;
  const described = (f: FieldName, hint = false) => ({
    "aria-invalid": !!problem(f),
    "aria-describedby": describedBy(`project-${f}`, { hint, problem: !!problem(f) }),
  });
  const input = (f: FieldName, reg: UseFormRegisterReturn, props: Record<string, unknown> = {}, hint = false) => (
    <input id={`project-${f}`} className="field-input" {...described(f, hint)} {...props} {...reg} />
  );

  return (
    <form
      className={project ? "space-y-5" : "card space-y-5"}
      noValidate
      onSubmit={handleSubmit((v) => {
        setFailure(null);
        setSaved(false);
        save.mutate(v);
      })}
    >
      <Field id="project-name" label="Project name" problem={problem("name")}>
        {input("name", register("name"), { maxLength: LIMITS.name, placeholder: "e.g. Route 4 Heron Creek Bridge — deck overlay" })}
      </Field>
      <div className="grid gap-4 sm:grid-cols-2">
        <Field id="project-structureName" label="Structure" problem={problem("structureName")}>
          {input("structureName", register("structureName"), { maxLength: LIMITS.name, placeholder: "e.g. Heron Creek Bridge (northbound)" })}
        </Field>
        <Field id="project-region" label="Region (optional)" problem={problem("region")}>
          {input("region", register("region"), { maxLength: LIMITS.name, placeholder: "e.g. Marrin County" })}
        </Field>
      </div>
      <div className="grid gap-4 sm:grid-cols-3">
        <Field id="project-deckLengthFt" label="Deck length (ft)" problem={problem("deckLengthFt")}>
          {input("deckLengthFt", register("deckLengthFt", { valueAsNumber: true }), { type: "number", inputMode: "decimal", min: 1, max: 50_000, step: "any" })}
        </Field>
        <Field id="project-startStationFt" label="Start station" hint="Feet (1250) or a station (12+50)." problem={problem("startStationFt")}>
          {input("startStationFt", register("startStationFt"), { maxLength: 40 }, true)}
        </Field>
        <Field id="project-lanes" label="Lanes" hint="Names, separated by commas." problem={problem("lanes")}>
          {input("lanes", register("lanes"), { maxLength: 200 }, true)}
        </Field>
      </div>
      <Field id="project-description" label="Description (optional)" problem={problem("description")}>
        <textarea id="project-description" rows={3} className="field-input" maxLength={LIMITS.description} {...described("description")} {...register("description")} />
      </Field>
      <FormFailure text={failure} />
      {project && (
        <p className="text-xs text-muted">Scenarios keep the deck they were saved with; a new scenario starts from the deck here.</p>
      )}
      <SubmitRow
        label={project ? "Save details" : "Create the project"}
        busyLabel={project ? "Saving…" : "Creating…"}
        busy={save.isPending}
        status={saved && !formState.isDirty ? "Details saved." : ""}
      />
    </form>
  );
}
