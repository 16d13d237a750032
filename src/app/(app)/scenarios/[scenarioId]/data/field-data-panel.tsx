"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api, ApiError, uploadFile } from "@/lib/api-client";
import { UploadProblems } from "@/components/upload-problems";
import { applyClimateFit, applySurvey } from "@/lib/csv/apply";
import { formatDateTime, formatStation, formatPercent } from "@/lib/format";
import type { ScenarioAnswer } from "@/lib/scenario-contract";
import type { SurveyUploadPreview, UploadAnswer, UploadsAnswer, WeatherUploadPreview } from "@/lib/upload-contract";
import { WeatherPreview } from "./weather-preview";

function ApplyButton({ scenarioId, label, build }: { scenarioId: string; label: string; build: (definition: Record<string, any>) => Record<string, any> }) {
  const router = useRouter();
  const qc = useQueryClient();
  const apply = useMutation({
    mutationFn: async () => {
      const { scenario } = await api<ScenarioAnswer>(`/api/scenarios/${scenarioId}`);
      const definition = build(scenario.definition);
      return api(`/api/scenarios/${scenarioId}`, { method: "PUT", body: { name: scenario.name, description: scenario.description, definition, version: scenario.version, changeNote: label } });
    },
    onSuccess: () => {
      qc.invalidateQueries({ queryKey: ["scenarios", scenarioId] });
      router.refresh();
    },
  });
  return (
    <div className="mt-4">
      <button type="button" className="btn-primary" disabled={apply.isPending || apply.isSuccess} onClick={() => apply.mutate()}>
        {apply.isSuccess ? "Applied — saved as a new version" : apply.isPending ? "Applying…" : "Apply to the plan"}
      </button>
      {apply.isError && (
        <p role="alert" className="field-error">
          {apply.error instanceof ApiError && apply.error.status === 409 ? "Someone saved the plan meanwhile. Reload the page and apply again." : apply.error.message}
        </p>
      )}
    </div>
  );
}

function SurveyPreview({ p }: { p: SurveyUploadPreview }) {
  return (
    <div className="mt-4 scroll-x">
      <p className="text-sm">
        {p.ranges.length} ranges replace the {p.current.length} now in the plan. Packets outside every range use the scenario&apos;s default chance.
      </p>
      <table className="mt-3 w-full min-w-[420px] border-collapse" data-testid="survey-table">
        <thead>
          <tr>
            <th className="table-head">From</th>
            <th className="table-head">To</th>
            <th className="table-head">Chance of deeper repair per packet</th>
          </tr>
        </thead>
        <tbody>
          {p.ranges.map((r, i) => (
            <tr key={i}>
              <td className="table-cell">{formatStation(r.fromStationFt)}</td>
              <td className="table-cell">{formatStation(r.toStationFt)}</td>
              <td className="table-cell">{formatPercent(r.probability)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function UploadCard({ scenarioId, kind }: { scenarioId: string; kind: "weather" | "survey" }) {
  const [file, setFile] = useState<File | null>(null);
  const [units, setUnits] = useState({ temperature: "auto", precipitation: "auto", wind: "auto" });
  const qc = useQueryClient();
  const check = useMutation({
    mutationFn: () => {
      const data = new FormData();
      data.set("kind", kind);
      if (kind === "weather") Object.entries(units).forEach(([k, v]) => data.set(k, v));
      if (file) data.set("file", file);
      return uploadFile<UploadAnswer>(`/api/scenarios/${scenarioId}/uploads`, data);
    },
    onSuccess: () => qc.invalidateQueries({ queryKey: ["scenarios", scenarioId, "uploads"] }),
  });
  const id = `${kind}-file`;
  return (
    <section className="card" aria-labelledby={`${kind}-heading`}>
      <h2 id={`${kind}-heading`}>{kind === "weather" ? "Daily weather history" : "Deck survey"}</h2>
      <p className="mt-1 text-sm text-muted">
        {kind === "weather" ? (
          <>
            A station&apos;s daily record as CSV, one row a day (several years if you have them): a date, the maximum and minimum temperature,
            precipitation and optionally wind. Common column names are understood — <code>TMAX</code>, <code>temp_max</code>, <code>Max Temp (°F)</code>,{" "}
            <code>PRCP</code>, <code>precipitation</code>, <code>AWND</code> … — and other columns are ignored; days with a value missing are skipped. Units
            are read from the headers unless you choose them. Pourline shows which column it read as what, checks that the months look like a real
            climate, and fits the monthly profile beside the current one before anything changes.
          </>
        ) : (
          <>
            A CSV with <code>from_station, to_station</code> (feet or <code>12+50</code>) and either <code>repair_share</code> (0–1) or{" "}
            <code>condition_rating</code> (0–9). It sets the chance that milling or hydrodemolition finds deeper deterioration in each range.
          </>
        )}{" "}
        Up to 5 MB; a file with any bad row imports nothing.
      </p>
      <form
        className="mt-4 flex flex-wrap items-end gap-4"
        onSubmit={(e) => {
          e.preventDefault();
          check.mutate();
        }}
      >
        <div>
          <label htmlFor={id} className="field-label">
            CSV file
          </label>
          <input id={id} type="file" accept=".csv,text/csv" className="field-input" onChange={(e) => setFile(e.target.files?.[0] ?? null)} data-testid={`${kind}-file`} />
        </div>
        {kind === "weather" && (
          <>
            <div>
              <label htmlFor="unit-temperature" className="field-label">
                Temperatures in
              </label>
              <select id="unit-temperature" className="field-input" value={units.temperature} onChange={(e) => setUnits({ ...units, temperature: e.target.value })}>
                <option value="auto">as the file says</option>
                <option value="F">°F</option>
                <option value="C">°C</option>
              </select>
            </div>
            <div>
              <label htmlFor="unit-precipitation" className="field-label">
                Precipitation in
              </label>
              <select id="unit-precipitation" className="field-input" value={units.precipitation} onChange={(e) => setUnits({ ...units, precipitation: e.target.value })}>
                <option value="auto">as the file says</option>
                <option value="in">inches</option>
                <option value="mm">millimetres</option>
              </select>
            </div>
            <div>
              <label htmlFor="unit-wind" className="field-label">
                Wind in
              </label>
              <select id="unit-wind" className="field-input" value={units.wind} onChange={(e) => setUnits({ ...units, wind: e.target.value })}>
                <option value="auto">as the file says</option>
                <option value="mph">mph</option>
                <option value="kmh">km/h</option>
                <option value="ms">m/s</option>
              </select>
            </div>
          </>
        )}
        <button type="submit" className="btn-secondary" disabled={!file || check.isPending} data-testid={`${kind}-check`}>
          {check.isPending ? "Checking…" : "Check the file"}
        </button>
      </form>
      {check.isError && <UploadProblems error={check.error} />}
      {check.data?.preview.kind === "weather" && (
        <>
          <WeatherPreview p={check.data.preview} />
          <ApplyButton scenarioId={scenarioId} label={`Weather profile fitted from ${check.data.upload.filename}`} build={(d) => applyClimateFit(d, (check.data!.preview as WeatherUploadPreview).fit)} />
        </>
      )}
      {check.data?.preview.kind === "survey" && (
        <>
          <SurveyPreview p={check.data.preview} />
          <ApplyButton scenarioId={scenarioId} label={`Deck survey from ${check.data.upload.filename}`} build={(d) => applySurvey(d, (check.data!.preview as SurveyUploadPreview).ranges)} />
        </>
      )}
    </section>
  );
}

export function FieldDataPanel({ scenarioId }: { scenarioId: string }) {
  const uploads = useQuery({
    queryKey: ["scenarios", scenarioId, "uploads"],
    queryFn: () => api<UploadsAnswer>(`/api/scenarios/${scenarioId}/uploads`).then((r) => r.uploads),
  });
  return (
    <div className="space-y-5">
      <UploadCard scenarioId={scenarioId} kind="weather" />
      <UploadCard scenarioId={scenarioId} kind="survey" />
      <section className="card" aria-labelledby="uploads-heading">
        <h2 id="uploads-heading">Files received</h2>
        {uploads.isPending ? (
          <p className="mt-2 text-sm text-muted">Loading…</p>
        ) : uploads.isError ? (
          <p role="alert" className="mt-2 text-sm text-bad">
            {uploads.error.message}
          </p>
        ) : uploads.data.length === 0 ? (
          <p className="mt-2 text-sm text-muted">No files yet. Each file that passes its checks is kept here with who sent it.</p>
        ) : (
          <ul className="mt-2 divide-y divide-line text-sm">
            {uploads.data.map((u) => (
              <li key={u.id} className="py-2">
                <span className="font-medium">{u.filename}</span> · {u.kind === "weather" ? "weather history" : "deck survey"} · {u.rowCount} rows ·{" "}
                {formatDateTime(u.uploadedAt)} by {u.uploadedByName}
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
