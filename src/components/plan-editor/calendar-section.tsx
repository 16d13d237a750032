"use client";
/** Section 3: dates, shifts, work days, closures and their windows, holidays and the season plan. */
import { useState } from "react";
import { useFieldArray, useFormContext, useWatch } from "react-hook-form";
import type { ScenarioInput } from "@sim/schema";
import { CheckboxField, CheckboxGroup, NumberField, SelectField, TextField, n } from "./fields";
import { EditableTable } from "./editable-table";
import { StationField } from "./station-field";
import { freshId } from "./plan-logic";

const WEEKDAYS = ["Sun", "Mon", "Tue", "Wed", "Thu", "Fri", "Sat"].map((label, value) => ({ value, label }));
const DAY_TYPES = [
  { value: "weekday", label: "Weekday" },
  { value: "saturday", label: "Saturday" },
  { value: "sunday", label: "Sunday" },
  { value: "holiday", label: "Holiday" },
];

export function CalendarSection({ readOnly }: { readOnly: boolean }) {
  const { control, setValue, getValues } = useFormContext<ScenarioInput>();
  const shifts = useFieldArray({ control, name: "calendar.shifts", keyName: "key" });
  const closures = useFieldArray({ control, name: "calendar.closures", keyName: "key" });
  const windows = useFieldArray({ control, name: "calendar.closureWindows", keyName: "key" });
  const lanes = useWatch({ control, name: "deck.lanes" }) ?? [];
  const closureList = useWatch({ control, name: "calendar.closures" }) ?? [];
  const plan = useWatch({ control, name: "calendar.season.plan" });
  const cutoffFt = useWatch({ control, name: "calendar.season.cutoffStationFt" });
  const cutoffDate = useWatch({ control, name: "calendar.season.cutoffDate" });
  const blackout = (useWatch({ control, name: "calendar.holidays.blackoutDates" }) ?? []) as string[];
  const [newDate, setNewDate] = useState("");
  const laneOptions = lanes.map((l) => ({ value: l, label: l }));
  const closureOptions = closureList.map((c) => ({ value: c.id, label: c.name || c.id }));

  const setBlackout = (dates: string[]) => setValue(n("calendar.holidays.blackoutDates"), dates as never, { shouldDirty: true, shouldValidate: true });

  return (
    <div className="space-y-5">
      <section className="card" aria-labelledby="dates-heading">
        <h2 id="dates-heading">Dates and work days</h2>
        <div className="mt-3 grid gap-4 sm:grid-cols-3">
          <TextField name="startDate" label="Start date" type="date" />
          <TextField name="targetDate" label="Target date (optional)" type="date" optional />
          <CheckboxGroup name="calendar.workDays" legend="Work days" options={WEEKDAYS} />
        </div>
      </section>

      <EditableTable
        id="shifts-heading"
        title="Shifts"
        note="A shift belongs to the day it starts; a night shift may run past midnight."
        heads={["Id", "Name", "Start hour (0–24)", "Length (h)"]}
        minWidthClass="min-w-[640px]"
        readOnly={readOnly}
        addLabel="Add shift"
        onAdd={() => shifts.append({ id: freshId("shift", (getValues("calendar.shifts") ?? []).map((s) => s.id)), name: "New shift", startHour: 7, lengthHours: 10 })}
        rows={shifts.fields.map((f, i) => ({
          key: f.key,
          removeLabel: `Remove shift ${i + 1}`,
          onRemove: () => shifts.remove(i),
          cells: [
            <TextField key="id" name={`calendar.shifts.${i}.id`} label={`Shift ${i + 1} id`} hideLabel />,
            <TextField key="name" name={`calendar.shifts.${i}.name`} label={`Shift ${i + 1} name`} hideLabel />,
            <NumberField key="start" name={`calendar.shifts.${i}.startHour`} label={`Shift ${i + 1} start hour`} hideLabel min={0} max={24} />,
            <NumberField key="length" name={`calendar.shifts.${i}.lengthHours`} label={`Shift ${i + 1} length in hours`} hideLabel min={0} max={24} />,
          ],
        }))}
      />

      <EditableTable
        id="closures-heading"
        title="Short-term closures"
        note={
          <>
            Closed only while a crew works under them, on top of the stage&apos;s lanes behind barrier (see Stages). Work starts only after set-up; lanes count as
            closed while switching (set-up and take-down).
          </>
        }
        heads={["Id", "Name", "Lanes closed", "Set-up (h)", "Take-down (h)"]}
        headClasses={["w-32", "", "w-48", "w-28", "w-28"]}
        minWidthClass="min-w-[760px]"
        readOnly={readOnly}
        addLabel="Add closure"
        onAdd={() => closures.append({ id: freshId("closure", (getValues("calendar.closures") ?? []).map((c) => c.id)), name: "New closure", lanesClosed: lanes.slice(0, 1), setupHours: 0, takedownHours: 0 })}
        rows={closures.fields.map((f, i) => ({
          key: f.key,
          removeLabel: `Remove closure ${i + 1}`,
          onRemove: () => closures.remove(i),
          cells: [
            <TextField key="id" name={`calendar.closures.${i}.id`} label={`Closure ${i + 1} id`} hideLabel />,
            <TextField key="name" name={`calendar.closures.${i}.name`} label={`Closure ${i + 1} name`} hideLabel />,
            <CheckboxGroup key="lanes" name={`calendar.closures.${i}.lanesClosed`} legend={`Closure ${i + 1} lanes closed`} hideLegend options={laneOptions} />,
            <NumberField key="setup" name={`calendar.closures.${i}.setupHours`} label={`Closure ${i + 1} set-up hours`} hideLabel min={0} max={12} />,
            <NumberField key="takedown" name={`calendar.closures.${i}.takedownHours`} label={`Closure ${i + 1} take-down hours`} hideLabel min={0} max={12} />,
          ],
        }))}
      />

      <EditableTable
        id="windows-heading"
        title="Closure windows"
        note="When each closure may be set up. An end hour at or before the start hour runs overnight into the next day."
        heads={["Closure", "Day types", "Start hour", "End hour"]}
        headClasses={["", "w-56", "w-28", "w-40"]}
        minWidthClass="min-w-[760px]"
        readOnly={readOnly}
        addLabel="Add window"
        addDisabled={closureList.length === 0}
        onAdd={() => windows.append({ closure: closureList[0]?.id ?? "", dayTypes: ["weekday"], startHour: 20, endHour: 6 })}
        rows={windows.fields.map((f, i) => ({
          key: f.key,
          removeLabel: `Remove window ${i + 1}`,
          onRemove: () => windows.remove(i),
          cells: [
            <SelectField key="closure" name={`calendar.closureWindows.${i}.closure`} label={`Window ${i + 1} closure`} hideLabel options={closureOptions} />,
            <CheckboxGroup key="days" name={`calendar.closureWindows.${i}.dayTypes`} legend={`Window ${i + 1} day types`} hideLegend options={DAY_TYPES} />,
            <NumberField key="start" name={`calendar.closureWindows.${i}.startHour`} label={`Window ${i + 1} start hour`} hideLabel min={0} max={24} />,
            <WindowEnd key="end" i={i} />,
          ],
        }))}
      />

      <section className="card" aria-labelledby="holidays-heading">
        <h2 id="holidays-heading">Holidays</h2>
        <div className="mt-3 grid gap-4 sm:grid-cols-2">
          <SelectField
            name="calendar.holidays.policy"
            label="Holiday policy"
            options={[
              { value: "standDown", label: "Stand down (from the hour below, the day before)" },
              { value: "workThrough", label: "Work through" },
            ]}
          />
          <CheckboxField name="calendar.holidays.observeFederal" label="Observe federal holidays" className="pt-7" />
          <NumberField
            name="calendar.holidays.standDownStartHour"
            label="Stand-down starts at (hour of the day before)"
            hint="15 = 15:00; 12 = noon; 0 = the whole day before. Crews come back with the first shift that starts after the stand-down: a night shift begun on its last day is not worked."
            min={0}
            max={24}
            step="0.5"
          />
          <CheckboxField
            name="calendar.holidays.standDownThroughMonday"
            label="Also stand down the Monday after a holiday weekend"
            className="pt-7"
          />
        </div>
        <fieldset className="mt-4">
          <legend className="field-label">Blackout dates (treated as holidays)</legend>
          {blackout.length === 0 ? (
            <p className="mt-1 text-sm text-muted">None.</p>
          ) : (
            <ul className="mt-2 flex flex-wrap gap-2">
              {blackout.map((d, i) => (
                <li key={`${d}-${i}`} className="badge gap-1 border border-line bg-paper text-ink">
                  {d}
                  {!readOnly && (
                    <button type="button" className="ml-1 text-bad" aria-label={`Remove blackout date ${d}`} onClick={() => setBlackout(blackout.filter((_, j) => j !== i))}>
                      ×
                    </button>
                  )}
                </li>
              ))}
            </ul>
          )}
          {!readOnly && (
            <div className="mt-2 flex items-end gap-2">
              <div>
                <label htmlFor="new-blackout-date" className="sr-only">
                  New blackout date
                </label>
                <input id="new-blackout-date" type="date" className="field-input" value={newDate} onChange={(e) => setNewDate(e.target.value)} />
              </div>
              <button
                type="button"
                className="btn-secondary"
                disabled={!/^\d{4}-\d{2}-\d{2}$/.test(newDate) || blackout.includes(newDate)}
                onClick={() => {
                  setBlackout([...blackout, newDate].sort());
                  setNewDate("");
                }}
              >
                Add date
              </button>
            </div>
          )}
        </fieldset>
      </section>

      <section className="card" aria-labelledby="season-heading">
        <h2 id="season-heading">Season plan</h2>
        <div className="mt-3 grid gap-4 sm:grid-cols-3">
          <SelectField
            name="calendar.season.plan"
            label="Plan"
            options={[
              { value: "single", label: "Single season (resume after winter)" },
              { value: "two", label: "Two seasons (cut-off before winter)" },
            ]}
          />
          <TextField name="calendar.season.winterStart" label="Winter starts (MM-DD)" />
          <TextField name="calendar.season.winterEnd" label="Winter ends (MM-DD)" hint="The first day back; its first shift is the first to start that day (a night shift of the day before is not worked)." />
          <NumberField name="calendar.season.demobilizeHours" label="Demobilize before winter (h)" min={0} />
          <NumberField name="calendar.season.remobilizeHours" label="Remobilize after winter (h)" min={0} />
        </div>
        {/* Shown for a single-season plan too while a cut-off is set, so the validator's complaint can be fixed here. */}
        {plan === "two" || cutoffDate || (typeof cutoffFt === "number" && Number.isFinite(cutoffFt)) ? (
          <div className="mt-4 grid gap-4 sm:grid-cols-3">
            <TextField name="calendar.season.cutoffDate" label="Cut-off date (optional)" type="date" optional />
            <StationField
              name="calendar.season.cutoffStationFt"
              label="Cut-off station (optional)"
              emptyMeans="No cut-off station: packets from anywhere may wait for season 2."
            />
          </div>
        ) : (
          <p className="mt-3 text-sm text-muted">A single-season plan has no cut-off: unfinished work resumes after the winter.</p>
        )}
      </section>
    </div>
  );
}

function WindowEnd({ i }: { i: number }) {
  const { control } = useFormContext<ScenarioInput>();
  const w = useWatch({ control, name: n(`calendar.closureWindows.${i}`) }) as { startHour?: number; endHour?: number } | undefined;
  const overnight = w && typeof w.startHour === "number" && typeof w.endHour === "number" && w.endHour <= w.startHour;
  return (
    <NumberField
      name={`calendar.closureWindows.${i}.endHour`}
      label={`Window ${i + 1} end hour`}
      hideLabel
      min={0}
      max={24}
      hint={overnight ? "Runs overnight into the next day" : undefined}
    />
  );
}
