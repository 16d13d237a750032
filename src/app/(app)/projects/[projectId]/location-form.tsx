"use client";
import { useState } from "react";
import { useMutation } from "@tanstack/react-query";
import { api, ApiError } from "@/lib/api-client";
import type { ProjectLocation } from "@/lib/project-contract";

/** Where the structure is, for the week-ahead weather forecast. Administrators and engineers change it; everyone sees it. */
export function LocationForm({ projectId, latitude, longitude, canEdit }: { projectId: string; latitude: number | null; longitude: number | null; canEdit: boolean }) {
  const [lat, setLat] = useState(latitude === null ? "" : String(latitude));
  const [lon, setLon] = useState(longitude === null ? "" : String(longitude));
  const save = useMutation({
    mutationFn: () => {
      // Not a number: sent as typed, so the server names the field instead of the value silently clearing it.
      const num = (s: string) => (s.trim() === "" ? null : Number.isFinite(Number(s)) ? Number(s) : s);
      return api<ProjectLocation>(`/api/projects/${projectId}/location`, { method: "PUT", body: { latitude: num(lat), longitude: num(lon) } });
    },
  });
  const problem = (path: string) => (save.error instanceof ApiError ? save.error.fields.find((f) => f.path === path)?.message : undefined);
  const shown = latitude === null || longitude === null ? "not set" : `${latitude}, ${longitude}`;
  if (!canEdit)
    return (
      <p className="text-sm text-muted" data-testid="project-location">
        Location for the weather forecast: {shown}.
      </p>
    );
  return (
    <section className="card" aria-labelledby="location-heading" data-testid="project-location">
      <h2 id="location-heading">Location for the weather forecast</h2>
      <p className="mt-1 text-sm text-muted">Latitude and longitude of the structure in decimal degrees (north and east positive). Leave both empty to clear.</p>
      <form
        className="mt-3 grid gap-3 sm:grid-cols-[1fr_1fr_auto] sm:items-start"
        onSubmit={(e) => {
          e.preventDefault();
          save.mutate();
        }}
      >
        {[
          { id: "latitude", label: "Latitude", value: lat, set: setLat },
          { id: "longitude", label: "Longitude", value: lon, set: setLon },
        ].map((f) => (
          <div key={f.id}>
            <label htmlFor={`location-${f.id}`} className="field-label">
              {f.label}
            </label>
            <input
              id={`location-${f.id}`}
              className="field-input"
              inputMode="decimal"
              value={f.value}
              onChange={(e) => f.set(e.target.value)}
              aria-invalid={!!problem(f.id)}
              aria-describedby={problem(f.id) ? `location-${f.id}-error` : undefined}
            />
            {problem(f.id) && (
              <p id={`location-${f.id}-error`} className="field-error">
                {problem(f.id)}
              </p>
            )}
          </div>
        ))}
        <button type="submit" className="btn-primary sm:mt-6" disabled={save.isPending}>
          Save location
        </button>
      </form>
      {save.isSuccess && <p role="status" className="mt-2 text-sm text-ok">Saved. The forecast for the new location is fetched when the week ahead is next opened.</p>}
      {save.isError && !problem("latitude") && !problem("longitude") && (
        <p role="alert" className="mt-2 text-sm text-bad">
          {save.error.message}
        </p>
      )}
    </section>
  );
}
