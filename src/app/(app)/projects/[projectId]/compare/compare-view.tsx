"use client";
/**
 * The compare page body: pick 2–4 scenarios (kept in the URL as ?ids=, first = baseline), their confidence
 * curves on one date axis, and the table of figures with differences from the first. Data: the project's
 * scenario list (for the checkboxes) and /api/projects/<id>/compare (latest plan run of each chosen scenario, and its
 * newest re-forecast from the field log, which the page says beside the plan runs).
 */
import Link from "next/link";
import { useEffect, useMemo, useState } from "react";
import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { formatIsoDate } from "@/lib/format";
import { cdfPoints, ConfidenceChart, LineSwatch, seriesStyle, type Curve } from "@/components/results";
import { compareRows, olderRulesNotice, reforecastNotice, reforecastText } from "@/components/results/compare-logic";
import { MAX_COMPARE, type CompareAnswer, type CompareScenario } from "@/lib/compare-contract";
import type { ScenarioListAnswer } from "@/lib/scenario-list-contract";
import { quantileText } from "@/components/results/summary-text";
import { VariantForm } from "./variant-form";
import { VerificationBadge } from "@/components/results/verification-badge";

export function CompareView({ projectId, canEdit, initialIds }: { projectId: string; canEdit: boolean; initialIds: string[] }) {
  const [selected, setSelected] = useState<string[]>(initialIds);
  const list = useQuery({
    queryKey: ["projects", projectId, "scenarios"],
    queryFn: () => api<ScenarioListAnswer>(`/api/projects/${projectId}/scenarios`).then((r) => r.scenarios),
  });
  const known = useMemo(() => new Set((list.data ?? []).map((s) => s.id)), [list.data]);
  const valid = list.data ? selected.filter((id) => known.has(id)) : [];
  const dropped = list.data ? selected.length - valid.length : 0;

  // The choice lives in the URL so a comparison can be bookmarked or sent; replaceState avoids a server round trip.
  useEffect(() => {
    const url = new URL(window.location.href);
    if (selected.length) url.searchParams.set("ids", selected.join(","));
    else url.searchParams.delete("ids");
    window.history.replaceState(null, "", url.toString().replace(/%2C/g, ","));
  }, [selected]);

  const key = valid.join(",");
  const compare = useQuery({
    queryKey: ["projects", projectId, "compare", key],
    queryFn: () => api<CompareAnswer>(`/api/projects/${projectId}/compare?ids=${key}`).then((r) => r.scenarios),
    enabled: valid.length >= 2,
    placeholderData: keepPreviousData,
  });

  const toggle = (id: string) =>
    setSelected((cur) => (cur.includes(id) ? cur.filter((x) => x !== id) : cur.length >= MAX_COMPARE ? cur : [...cur, id]));
  const makeBaseline = (id: string) => setSelected((cur) => [id, ...cur.filter((x) => x !== id)]);

  if (list.isPending) {
    return (
      <div className="card" aria-busy="true">
        <p className="text-sm text-muted">Loading scenarios…</p>
        <div className="mt-3 space-y-2">{[0, 1, 2].map((i) => <div key={i} className="h-8 animate-pulse rounded bg-paper" />)}</div>
      </div>
    );
  }
  if (list.isError) {
    return (
      <div className="card border-bad/40" role="alert">
        <h2 className="text-bad">Could not load the scenarios</h2>
        <p className="mt-1 text-sm">{list.error.message}</p>
        <button className="btn-secondary mt-3" onClick={() => list.refetch()}>
          Try again
        </button>
      </div>
    );
  }
  if (list.data.length < 2) {
    return (
      <div className="card text-center">
        <h2>Nothing to compare yet</h2>
        <p className="mt-2 text-sm text-muted">A comparison needs at least two scenarios in this project. {canEdit ? "Make a variant of a scenario to try a different plan." : ""}</p>
        <Link href={`/projects/${projectId}`} className="btn-secondary mt-4">
          Back to the project
        </Link>
      </div>
    );
  }

  const order = new Map(valid.map((id, i) => [id, i]));
  const full = valid.length >= MAX_COMPARE;
  return (
    <div className="space-y-5">
      <section className="card" aria-labelledby="choose-heading">
        <fieldset>
          <legend id="choose-heading" className="text-lg font-semibold">
            Choose 2 to 4 scenarios
          </legend>
          <p className="text-sm text-muted" id="choose-help">
            The first one you choose is the baseline; the others show their difference from it. {full ? "Four are chosen: clear one to choose another." : ""}
          </p>
          <ul className="mt-3 grid gap-2 md:grid-cols-2" data-testid="compare-choices">
            {list.data.map((s) => {
              const checked = order.has(s.id);
              const disabled = !checked && full;
              return (
                <li key={s.id}>
                  <label
                    className={`flex cursor-pointer items-start gap-3 rounded-md border px-3 py-2 text-sm ${checked ? "border-brand-600 bg-brand-50" : "border-line bg-white"} ${disabled ? "cursor-not-allowed opacity-60" : ""}`}
                  >
                    <input type="checkbox" className="mt-0.5 h-4 w-4 accent-brand-600" checked={checked} disabled={disabled} onChange={() => toggle(s.id)} aria-describedby="choose-help" />
                    <span className="min-w-0 flex-1">
                      <span className="block font-medium">{s.name}</span>
                      <span className="block text-xs text-muted">
                        {s.runSummary ? <>P80 {quantileText(s.runSummary.finish.p80)}</> : "not run yet"}
                        {s.reforecastP80 && <> · re-forecast from the field log: P80 {quantileText(s.reforecastP80)}</>}
                        {s.runId && s.runStale && <span className="badge ml-2 bg-warn-bg text-warn">Stale</span>}
                      </span>
                    </span>
                    {checked && (
                      <span className="badge shrink-0 bg-brand-600 text-white">
                        {order.get(s.id) === 0 ? "Baseline" : `#${order.get(s.id)! + 1}`}
                      </span>
                    )}
                  </label>
                </li>
              );
            })}
          </ul>
          {dropped > 0 && (
            <p className="mt-2 text-sm text-warn" role="status">
              {dropped === 1 ? "One scenario in the link is" : `${dropped} scenarios in the link are`} no longer in this project and were left out.
            </p>
          )}
        </fieldset>
      </section>

      {valid.length < 2 ? (
        <div className="card text-center text-sm text-muted" data-testid="compare-hint">
          {valid.length === 0 ? "Choose two to four scenarios above." : "Choose at least one more scenario to compare with."}
        </div>
      ) : compare.isError ? (
        <div className="card border-bad/40" role="alert">
          <h2 className="text-bad">Could not load the comparison</h2>
          <p className="mt-1 text-sm">{compare.error.message}</p>
          <button className="btn-secondary mt-3" onClick={() => compare.refetch()}>
            Try again
          </button>
        </div>
      ) : !compare.data ? (
        <div className="card" aria-busy="true">
          <p className="text-sm text-muted">Loading the latest runs…</p>
          <div className="mt-3 h-64 animate-pulse rounded bg-paper" />
        </div>
      ) : (
        <CompareResults scenarios={compare.data} canEdit={canEdit} projectId={projectId} onBaseline={makeBaseline} busy={compare.isFetching} />
      )}
    </div>
  );
}

function CompareResults({
  scenarios,
  canEdit,
  projectId,
  onBaseline,
  busy,
}: {
  scenarios: CompareScenario[];
  canEdit: boolean;
  projectId: string;
  onBaseline: (id: string) => void;
  busy: boolean;
}) {
  const curves: Curve[] = [];
  scenarios.forEach((s, i) => {
    const points = s.run ? cdfPoints(s.run.cdf) : [];
    if (points.length) curves.push({ id: s.id, name: s.name, points, ...seriesStyle(i) });
  });
  const rows = compareRows(scenarios);
  const notice = reforecastNotice(scenarios);
  const rulesNotice = olderRulesNotice(scenarios);
  const underWay = scenarios.find((s) => s.reforecast);
  const aria =
    "Confidence curves of the chosen scenarios on one date axis: " +
    scenarios.map((s) => (s.run ? `${s.name}, 80 % finish by ${quantileText(s.run.finish.p80)}` : `${s.name}, not run yet`)).join("; ") +
    ". The table below gives the figures.";
  return (
    <div className="space-y-5" aria-busy={busy || undefined}>
      {notice && (
        <div className="rounded-md border border-brand-700/30 bg-brand-50 px-4 py-3 text-sm" role="status" data-testid="compare-reforecast-notice">
          <p>
            <strong>{notice.lead}</strong>
          </p>
          {notice.lines.map((line) => (
            <p key={line} className="mt-1">
              {line}
            </p>
          ))}
          {canEdit && underWay && (
            <p className="mt-1">
              To weigh ways of finishing the job from here, run a{" "}
              <Link className="font-medium text-brand-700 underline" href={`/scenarios/${underWay.id}/search`}>
                plan search from the field log
              </Link>
              : each plan it tries starts from the work recorded.
            </p>
          )}
        </div>
      )}
      {rulesNotice && (
        <p className="rounded-md border border-warn/30 bg-warn-bg px-4 py-2 text-sm" role="status" data-testid="compare-older-rules">
          {rulesNotice}
        </p>
      )}
      <section className="card" aria-labelledby="curves-heading">
        <h2 id="curves-heading">Confidence curves</h2>
        <p className="mt-0.5 text-sm text-muted">Share of iterations finished by each date, one line per scenario.</p>
        <figure aria-label={aria} className="m-0 mt-3" data-testid="compare-curves">
          {curves.length === 0 ? (
            <p className="rounded-md border border-dashed border-line p-6 text-center text-sm text-muted">None of the chosen scenarios has a finished run to draw.</p>
          ) : (
            <div aria-hidden="true">
              <ConfidenceChart curves={curves} height={320} />
            </div>
          )}
          <figcaption className="mt-2">
            <ul className="flex flex-wrap gap-x-5 gap-y-1.5 text-xs" aria-label="Legend">
              {scenarios.map((s, i) => (
                <li key={s.id} className="flex items-center gap-1.5">
                  <LineSwatch {...seriesStyle(i)} />
                  {s.name}
                  {!s.run && <span className="text-muted">(not run yet)</span>}
                </li>
              ))}
            </ul>
          </figcaption>
        </figure>
      </section>

      <section className="card scroll-x p-0" aria-labelledby="figures-heading">
        <h2 id="figures-heading" className="px-5 pt-4">
          Figures
        </h2>
        <table className="mt-3 w-full min-w-[640px] border-collapse" data-testid="compare-table">
          <caption className="sr-only">Latest plan-run figures of each scenario, with the difference from the first scenario.</caption>
          <thead>
            <tr>
              <th scope="col" className="table-head w-48">
                Measure
              </th>
              {scenarios.map((s, i) => (
                <th key={s.id} scope="col" className="table-head align-top normal-case tracking-normal">
                  <div className="flex items-center gap-1.5">
                    <LineSwatch {...seriesStyle(i)} width={20} />
                    <Link href={`/scenarios/${s.id}`} className="text-sm font-semibold text-brand-700 hover:underline">
                      {s.name}
                    </Link>
                  </div>
                  <div className="mt-1 flex flex-wrap items-center gap-1.5 font-normal">
                    {i === 0 ? <span className="badge bg-brand-50 text-brand-800">Baseline</span> : null}
                    {s.run?.stale && <span className="badge bg-warn-bg text-warn">Stale run</span>}
                    {s.run?.olderRules && <span className="badge bg-warn-bg text-warn" title="Computed under earlier model rules">Older rules</span>}
                    {s.run && <VerificationBadge verification={s.run.verification} />}
                    {!s.run && <span className="badge border border-line text-muted">Not run yet</span>}
                    {s.run && s.run.unfinishedIterations > 0 && (
                      <span className="badge bg-warn-bg text-warn">{s.run.unfinishedIterations.toLocaleString("en-US")} unfinished</span>
                    )}
                  </div>
                  <div className="mt-1.5 flex flex-col items-start gap-1.5">
                    {i > 0 && (
                      <button type="button" className="btn-secondary px-2.5 py-1 text-xs" onClick={() => onBaseline(s.id)} aria-label={`Use ${s.name} as the baseline`}>
                        Use as baseline
                      </button>
                    )}
                    {canEdit && <VariantForm scenarioId={s.id} scenarioName={s.name} projectId={projectId} />}
                  </div>
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.id} data-metric={r.id}>
                <th scope="row" className="table-cell text-left font-medium">
                  {r.label}
                </th>
                {r.cells.map((c, i) => (
                  <td key={scenarios[i].id} className="table-cell">
                    <span className={c.text === "not run yet" ? "text-muted" : ""}>{c.text}</span>
                    {c.diff && <span className="ml-2 text-xs font-semibold text-muted">{c.diff}</span>}
                  </td>
                ))}
              </tr>
            ))}
            {notice && (
              <tr data-metric="reforecast">
                <th scope="row" className="table-cell text-left font-medium">
                  Re-forecast from the field log
                </th>
                {scenarios.map((s) => (
                  <td key={s.id} className="table-cell text-sm">
                    {s.reforecast ? reforecastText(s.reforecast) : <span className="text-muted">none</span>}
                  </td>
                ))}
              </tr>
            )}
            <tr>
              <th scope="row" className="table-cell text-left font-medium">
                Latest plan run
              </th>
              {scenarios.map((s) => (
                <td key={s.id} className="table-cell text-xs text-muted">
                  {s.run ? `${s.run.iterations.toLocaleString("en-US")} iterations, ${formatIsoDate(s.run.createdAt)}${s.run.stale ? ` (from v${s.run.scenarioVersion}; now v${s.version})` : ""}` : "—"}
                </td>
              ))}
            </tr>
          </tbody>
        </table>
      </section>
    </div>
  );
}
