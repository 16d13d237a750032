"use client";
/**
 * Section 2: per crew operation one table row (rate, crews, calendar) and under it a full-width row of its
 * weather gates, so the table fits a 1,440 px screen without hiding the gates; then the durations of waits.
 */
import { Fragment } from "react";
import { useFormContext, useWatch } from "react-hook-form";
import type { ScenarioInput } from "@sim/schema";
import { SafetyNote } from "@/components/safety-note";
import { CheckboxField, CheckboxGroup, NumberField, SelectField } from "./fields";
import { DistributionFields } from "./distribution-fields";

export function CrewsSection() {
  const { control } = useFormContext<ScenarioInput>();
  const operations = useWatch({ control, name: "operations" }) ?? [];
  const shifts = useWatch({ control, name: "calendar.shifts" }) ?? [];
  const closures = useWatch({ control, name: "calendar.closures" }) ?? [];
  const crew = operations.map((op, i) => ({ op, i })).filter((x) => x.op.kind === "crew");
  const wait = operations.map((op, i) => ({ op, i })).filter((x) => x.op.kind === "wait");
  const shiftOptions = shifts.map((s) => ({ value: s.id, label: s.name || s.id }));
  const closureOptions = [{ value: "", label: "None (stage barrier only)" }, ...closures.map((c) => ({ value: c.id, label: c.name || c.id }))];

  return (
    <div className="space-y-5">
      <SafetyNote compact />
      <section className="card scroll-x p-0" aria-labelledby="crew-ops-heading">
        <div className="px-5 py-4">
          <h2 id="crew-ops-heading">Crew operations</h2>
          <p className="mt-1 text-sm text-muted">
            Rates are sampled once per iteration. Weather limits marked <span aria-hidden="true">*</span>
            <span className="sr-only">with an asterisk</span> (temperatures, evaporation) are planning inputs: set them per your local specification.
            Temperature limits hold at both ends of each hour; &ldquo;rising&rdquo; means the air is not cooling that hour (warm nights can qualify).
            Protection applies to continuous work: after each packet the air must stay at or above that temperature for that many hours.
          </p>
        </div>
        {crew.length === 0 ? (
          <p className="px-5 pb-5 text-sm text-muted">No crew operations yet. Add one in Sequence.</p>
        ) : (
          <table className="w-full min-w-[980px] border-collapse" data-testid="crews-table">
            <thead>
              <tr>
                <th scope="col" className="table-head">Operation</th>
                <th scope="col" className="table-head">Rate</th>
                <th scope="col" className="table-head">Crews · mobilization</th>
                <th scope="col" className="table-head">Shifts · closure</th>
                <th scope="col" className="table-head">Working</th>
              </tr>
            </thead>
            <tbody>
              {crew.map(({ op, i }) => {
                if (op.kind !== "crew") return null;
                const p = `operations.${i}`;
                const who = op.name || op.id;
                const unit = op.rate?.unit === "ftPerShift" ? "ft/shift" : "ft/h";
                return (
                  <Fragment key={`${i}-${op.id}`}>
                  <tr className="align-top">
                    <th scope="row" rowSpan={2} className="table-cell text-left font-medium">
                      {who}
                      <span className="block text-xs font-normal text-muted">{op.id}</span>
                    </th>
                    <td className="table-cell">
                      <div className="space-y-2">
                        <SelectField
                          name={`${p}.rate.unit`}
                          srPrefix={`${who} — `}
                          label="rate unit"
                          className="w-36"
                          options={[
                            { value: "ftPerHour", label: "ft per hour" },
                            { value: "ftPerShift", label: "ft per shift" },
                          ]}
                        />
                        <DistributionFields base={`${p}.rate.dist`} who={`${who} rate`} unit={unit} />
                      </div>
                    </td>
                    <td className="table-cell">
                      <div className="space-y-2">
                        <NumberField name={`${p}.crews`} srPrefix={`${who} — `} label="crews" step="1" min={1} max={10} className="w-24" />
                        <NumberField name={`${p}.mobilizationHours`} srPrefix={`${who} — `} label="mobilization (h)" min={0} className="w-28" />
                      </div>
                    </td>
                    <td className="table-cell">
                      <div className="space-y-2">
                        <CheckboxGroup name={`${p}.shifts`} legend={`${who} — shifts`} options={shiftOptions} />
                        <SelectField name={`${p}.closure`} srPrefix={`${who} — `} label="short-term closure" className="w-56 max-w-full" options={closureOptions} optional />
                      </div>
                    </td>
                    <td className="table-cell">
                      <div className="space-y-1">
                        <CheckboxField name={`${p}.continuous`} label="Continuous (never stop a packet)" />
                        <CheckboxField name={`${p}.discovers`} label="Discovers deeper damage" />
                      </div>
                    </td>
                  </tr>
                  <tr className="align-top">
                    <td className="table-cell border-t-0 pt-0" colSpan={4}>
                      <p className="mb-1 text-xs font-semibold text-muted">
                        <span className="sr-only">{who} — </span>Weather gates
                      </p>
                      <div className="grid grid-cols-[repeat(auto-fill,minmax(8.5rem,1fr))] gap-2">
                        <NumberField name={`${p}.gates.minTempF`} srPrefix={`${who} — `} label="min °F *" optional />
                        <NumberField name={`${p}.gates.maxTempF`} srPrefix={`${who} — `} label="max °F *" optional />
                        <NumberField name={`${p}.gates.maxWindMph`} srPrefix={`${who} — `} label="max wind mph" optional min={0} />
                        <NumberField name={`${p}.gates.maxEvaporation`} srPrefix={`${who} — `} label="max evap. lb/ft²/h *" optional min={0} step="0.01" />
                        <NumberField name={`${p}.gates.noRainHoursAfter`} srPrefix={`${who} — `} label="no rain h after" optional min={0} />
                        <NumberField name={`${p}.gates.concreteDeltaF`} srPrefix={`${who} — `} label="concrete − air °F" optional />
                        <NumberField name={`${p}.gates.protectAfter.minTempF`} srPrefix={`${who} — `} label="protect ≥ °F after *" optional />
                        <NumberField name={`${p}.gates.protectAfter.hours`} srPrefix={`${who} — `} label="protect for h" optional min={0} max={72} />
                        <div className="space-y-1 pt-4">
                          <CheckboxField name={`${p}.gates.rising`} label="Rising temp. (not cooling)" />
                          <CheckboxField name={`${p}.gates.noRain`} label="No rain" />
                        </div>
                      </div>
                    </td>
                  </tr>
                  </Fragment>
                );
              })}
            </tbody>
          </table>
        )}
      </section>

      <section className="card scroll-x p-0" aria-labelledby="wait-ops-heading">
        <div className="px-5 py-4">
          <h2 id="wait-ops-heading">Wait operations</h2>
          <p className="mt-1 text-sm text-muted">
            No crew and no calendar: a packet waits this long (e.g. cure) once it is ready. With a temperature set, only hours with the air at or
            above it count, so a cure takes longer in cold weather (as cure clauses in agency specifications are written).
          </p>
        </div>
        {wait.length === 0 ? (
          <p className="px-5 pb-5 text-sm text-muted">No wait operations.</p>
        ) : (
          <table className="w-full min-w-[640px] border-collapse">
            <thead>
              <tr>
                <th scope="col" className="table-head">Operation</th>
                <th scope="col" className="table-head">Duration (hours)</th>
                <th scope="col" className="table-head">Counted hours</th>
              </tr>
            </thead>
            <tbody>
              {wait.map(({ op, i }) => (
                <tr key={`${i}-${op.id}`} className="align-top">
                  <th scope="row" className="table-cell text-left font-medium">
                    {op.name || op.id}
                    <span className="block text-xs font-normal text-muted">{op.id}</span>
                  </th>
                  <td className="table-cell">
                    <DistributionFields base={`operations.${i}.durationHours`} who={`${op.name || op.id} duration`} unit="h" />
                  </td>
                  <td className="table-cell">
                    <NumberField
                      name={`operations.${i}.countAboveF`}
                      srPrefix={`${op.name || op.id} — `}
                      label="only at or above °F *"
                      hint="Blank: every hour counts."
                      optional
                      className="w-44"
                    />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
    </div>
  );
}
