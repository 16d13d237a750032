"use client";
/**
 * Section 1: the operations as a graph (drag a handle to link, Delete to remove) with a side panel that does
 * every graph action by keyboard too. A proposed link that would close a loop is refused with the loop named.
 * Operations are laid out by dagre (graph-layout.ts) afresh whenever operations or links change, and the view
 * refits, so nothing lands on anything else and links stay on the canvas. Every link takes keyboard focus
 * (Tab), shows it, and Delete or Backspace on a focused link removes it.
 */
import "@xyflow/react/dist/style.css";
import { useEffect, useMemo, useRef, useState, type KeyboardEvent } from "react";
import { useFormContext, useWatch } from "react-hook-form";
import { Background, Controls, MarkerType, Position, ReactFlow, applyNodeChanges, type Connection, type Edge, type Node, type NodeChange, type ReactFlowInstance } from "@xyflow/react";
import type { Link, Operation, ScenarioInput } from "@sim/schema";
import { NumberField, TextField } from "./fields";
import { columnsFor, layoutGraph, MAX_COLUMNS_PER_ROW, NODE_HEIGHT, NODE_WIDTH, type GraphPosition } from "./graph-layout";
import { freshId, proposeLink } from "./plan-logic";
import { withoutOperation } from "./stages-logic";

type OpIn = ScenarioInput["operations"][number];
type LinkIn = ScenarioInput["links"][number];
/** Fit the whole graph, but never above full size (a short chain would otherwise be blown up). */
const FIT = { padding: 0.12, maxZoom: 1 };

function syncNodes(prev: Node[], ops: OpIn[], layout: Record<string, GraphPosition>): Node[] {
  const byId = new Map(prev.map((nd) => [nd.id, nd]));
  return ops.map((op) => {
    const old = byId.get(op.id);
    const data = {
      label: (
        // Larger than the library's 12 px: the view is fitted to the whole graph, at most at full size.
        <span className="block text-left">
          <span className="block text-[15px] leading-tight font-medium">{op.name || op.id}</span>
          <span className="block text-[13px] text-muted">{op.kind === "wait" ? "wait" : "crew"}</span>
        </span>
      ),
    };
    const { x, y } = layout[op.id] ?? { x: 0, y: 0 };
    const position = { x, y };
    const style = { width: NODE_WIDTH, height: NODE_HEIGHT };
    if (old) return { ...old, data, position, style };
    return { id: op.id, position, style, data, sourcePosition: Position.Right, targetPosition: Position.Left };
  });
}

/** Picks one operation (by id, shown by name) for a new link. */
function OperationSelect({ id, value, onChange, ops }: { id: string; value: string; onChange: (id: string) => void; ops: OpIn[] }) {
  return (
    <select id={id} className="field-input" value={value} onChange={(e) => onChange(e.target.value)}>
      <option value="">Choose…</option>
      {ops.map((o) => (
        <option key={o.id} value={o.id}>
          {o.name || o.id}
        </option>
      ))}
    </select>
  );
}

export function SequenceSection({ readOnly }: { readOnly: boolean }) {
  const { control, getValues, setValue } = useFormContext<ScenarioInput>();
  const ops = (useWatch({ control, name: "operations" }) ?? []) as OpIn[];
  const links = (useWatch({ control, name: "links" }) ?? []) as LinkIn[];
  const [nodes, setNodes] = useState<Node[]>([]);
  const [notice, setNotice] = useState<{ bad: boolean; text: string } | null>(null);
  const [newName, setNewName] = useState("");
  const [newKind, setNewKind] = useState<Operation["kind"]>("crew");
  const [linkFrom, setLinkFrom] = useState("");
  const [linkTo, setLinkTo] = useState("");

  const [flow, setFlow] = useState<ReactFlowInstance | null>(null);
  const opKey = ops.map((o) => `${o.id}\u0000${o.name}\u0000${o.kind}`).join("\u0001");
  const linkKey = links.map((l) => `${l.from}->${l.to}`).join("\u0001");
  // Rows as wide as the graph's box holds at full size (four columns on a desktop, two on a phone).
  const box = useRef<HTMLDivElement>(null);
  const [columns, setColumns] = useState(MAX_COLUMNS_PER_ROW);
  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const watch = new ResizeObserver(([entry]) => setColumns(columnsFor(entry.contentRect.width)));
    watch.observe(el);
    return () => watch.disconnect();
  }, []);
  // One layout per change of operations, links (opKey and linkKey stand for them) or row length; nodes and edges both read it.
  const layout = useMemo(
    () => layoutGraph((getValues("operations") ?? []).map((o) => o.id), getValues("links") ?? [], undefined, columns),
    [opKey, linkKey, columns, getValues],
  );
  useEffect(() => {
    setNodes((prev) => syncNodes(prev, getValues("operations") ?? [], layout));
  }, [layout, getValues]);
  // After a new layout, bring the whole graph into view (on the next frame, once React Flow has the new nodes).
  useEffect(() => {
    if (!flow) return;
    const raf = requestAnimationFrame(() => void flow.fitView(FIT));
    return () => cancelAnimationFrame(raf);
  }, [flow, nodes.length, linkKey, columns]);

  const label = (id: string) => ops.find((o) => o.id === id)?.name || id;
  const edges: Edge[] = useMemo(
    () =>
      links.map((l) => ({
        id: `${l.from}->${l.to}`,
        source: l.from,
        target: l.to,
        // Only lags that exist are written on the link (the panel lists both); "0 ft · 0 h" on every link is noise.
        label: [l.lagFt ? `${l.lagFt} ft` : "", l.lagHours ? `${l.lagHours} h` : ""].filter(Boolean).join(" · ") || undefined,
        ariaLabel: `Link ${label(l.from)} → ${label(l.to)}, lag ${l.lagFt ?? 0} ft and ${l.lagHours ?? 0} h${readOnly ? "" : "; press Delete to remove"}`,
        // A link that wraps to a later row runs in right angles through the gap between the rows (a curve would
        // cross the boxes of its own row).
        type: (layout[l.to]?.row ?? 0) !== (layout[l.from]?.row ?? 0) ? "smoothstep" : undefined,
        focusable: true,
        markerEnd: { type: MarkerType.ArrowClosed },
        labelBgPadding: [6, 3] as [number, number],
        labelStyle: { fontSize: 12 },
      })),
    // label() reads the operations, which opKey stands for.
    [links, opKey, readOnly, layout],
  );

  const write = (nextOps: OpIn[] | null, nextLinks: LinkIn[] | null) => {
    if (nextOps) setValue("operations", nextOps, { shouldDirty: true, shouldValidate: true });
    if (nextLinks) setValue("links", nextLinks, { shouldDirty: true, shouldValidate: true });
  };

  const addLink = (from: string, to: string) => {
    const current = getValues("links") ?? [];
    const verdict = proposeLink((getValues("operations") ?? []).map((o) => o.id), current, from, to, label);
    if (!verdict.ok) {
      setNotice({ bad: true, text: verdict.message });
      return false;
    }
    write(null, [...current, { from, to, lagFt: 0, lagHours: 0 }]);
    setNotice({ bad: false, text: `Linked ${label(from)} → ${label(to)}.` });
    return true;
  };

  const removeOperation = (id: string) => {
    write(
      (getValues("operations") ?? []).filter((o) => o.id !== id),
      (getValues("links") ?? []).filter((l) => l.from !== id && l.to !== id),
    );
    setValue("stages", withoutOperation(getValues("stages") ?? [], id), { shouldDirty: true, shouldValidate: true });
    setNotice({ bad: false, text: `Removed ${label(id)} and its links.` });
  };

  const removeLinks = (keys: string[]) => {
    write(null, (getValues("links") ?? []).filter((l) => !keys.includes(`${l.from}->${l.to}`)));
    if (keys.length === 1) {
      const [from, to] = keys[0].split("->");
      setNotice({ bad: false, text: `Removed the link ${label(from)} → ${label(to)}.` });
    }
  };

  // A focused link (Tab reaches each one) goes with Delete or Backspace, without first selecting it.
  const onGraphKeyDown = (e: KeyboardEvent<HTMLDivElement>) => {
    if (readOnly || (e.key !== "Delete" && e.key !== "Backspace")) return;
    const edge = (e.target as Element).closest?.(".react-flow__edge");
    const id = edge?.getAttribute("data-id");
    if (!id) return;
    e.preventDefault();
    e.stopPropagation();
    removeLinks([id]);
    document.querySelector<HTMLElement>('[data-testid="sequence-graph"]')?.focus();
  };

  const addOperation = () => {
    const name = newName.trim();
    if (!name) {
      setNotice({ bad: true, text: "Give the new operation a name first." });
      return;
    }
    const current = getValues("operations") ?? [];
    const id = freshId(name, current.map((o) => o.id));
    const cal = getValues("calendar");
    const op: OpIn =
      newKind === "wait"
        ? { id, name, kind: "wait", durationHours: { type: "fixed", value: 24 } }
        : {
            id,
            name,
            kind: "crew",
            rate: { unit: "ftPerHour", dist: { type: "fixed", value: 50 } },
            crews: 1,
            shifts: cal?.shifts?.[0] ? [cal.shifts[0].id] : [],
            closure: cal?.closures?.[0]?.id ?? "",
            mobilizationHours: 0,
            continuous: false,
            discovers: false,
            gates: { minTempF: undefined, rising: false, noRain: false, noRainHoursAfter: undefined, maxWindMph: undefined, maxEvaporation: undefined, concreteDeltaF: undefined },
          };
    write([...current, op], null);
    setNewName("");
    setNotice({ bad: false, text: `Added ${name} (${newKind}). Set its rate in Crews and rates.` });
  };

  const focusField = (id: string) => document.getElementById(id)?.focus();

  return (
    <div className="space-y-5">
      <section className="card" aria-labelledby="scenario-heading">
        <h2 id="scenario-heading">Scenario</h2>
        <div className="mt-3 grid gap-4 md:grid-cols-2">
          <TextField name="name" label="Name" />
          <TextField name="description" label="Description" />
        </div>
      </section>

      {/* The graph takes the full width (a seven-operation chain reads at a useful zoom); the panels sit below. */}
      <div className="space-y-5">
        <section className="card p-0" aria-labelledby="graph-heading">
          <div className="px-5 pt-4">
            <h2 id="graph-heading">Sequence</h2>
            <p className="mt-1 text-sm text-muted">
              {readOnly
                ? "How the operations follow each other."
                : "Drag from an operation's right handle to another's left handle to link them; select a link and press Delete to remove it. Everything here can also be done in the panel."}
            </p>
          </div>
          <div ref={box} className="sequence-graph mt-3 h-[26rem] border-t border-line" data-testid="sequence-graph" tabIndex={-1} onKeyDownCapture={onGraphKeyDown}>
            <ReactFlow
              onInit={setFlow}
              nodes={nodes}
              edges={edges}
              onNodesChange={(changes: NodeChange[]) => setNodes((nds) => applyNodeChanges(changes.filter((c) => c.type !== "remove"), nds))}
              onConnect={(c: Connection) => c.source && c.target && addLink(c.source, c.target)}
              onNodesDelete={(deleted) => deleted.forEach((d) => removeOperation(d.id))}
              onEdgesDelete={(deleted) => removeLinks(deleted.map((e) => e.id))}
              edgesFocusable
              onNodeClick={(_, node) => focusField(`operations.${ops.findIndex((o) => o.id === node.id)}.name`)}
              onEdgeClick={(_, edge) => focusField(`links.${links.findIndex((l) => `${l.from}->${l.to}` === edge.id)}.lagFt`)}
              nodesConnectable={!readOnly}
              deleteKeyCode={readOnly ? null : ["Delete", "Backspace"]}
              fitView
              fitViewOptions={FIT}
              minZoom={0.3}
            >
              <Background />
              <Controls showInteractive={false} />
            </ReactFlow>
          </div>
          <div className="px-5 py-3" aria-live="polite">
            {notice && (
              <p role={notice.bad ? "alert" : undefined} className={notice.bad ? "text-sm font-medium text-bad" : "text-sm text-ok"} data-testid="sequence-notice">
                {notice.text}
              </p>
            )}
          </div>
        </section>

        <div className="grid items-start gap-5 lg:grid-cols-2">
          <section className="card" aria-labelledby="ops-panel-heading">
            <h3 id="ops-panel-heading">Operations</h3>
            <ul className="mt-2 space-y-3">
              {ops.map((op, i) => (
                <li key={`${i}-${op.id}`} className="flex items-end gap-2">
                  <TextField name={`operations.${i}.name`} label={`Name of ${op.id} (${op.kind})`} className="min-w-0 flex-1" />
                  {!readOnly && (
                    <button type="button" className="btn-danger" onClick={() => removeOperation(op.id)} aria-label={`Remove operation ${op.name || op.id}`}>
                      Remove
                    </button>
                  )}
                </li>
              ))}
            </ul>
            {!readOnly && (
              <div className="mt-4 border-t border-line pt-3">
                <h4 className="text-sm font-semibold">Add an operation</h4>
                <div className="mt-2 flex flex-wrap items-end gap-2">
                  <div className="min-w-0 flex-1">
                    <label htmlFor="new-op-name" className="field-label">
                      Name
                    </label>
                    <input
                      id="new-op-name"
                      className="field-input"
                      value={newName}
                      onChange={(e) => setNewName(e.target.value)}
                      onKeyDown={(e) => {
                        if (e.key === "Enter") {
                          e.preventDefault();
                          addOperation();
                        }
                      }}
                    />
                  </div>
                  <div>
                    <label htmlFor="new-op-kind" className="field-label">
                      Kind
                    </label>
                    <select id="new-op-kind" className="field-input" value={newKind} onChange={(e) => setNewKind(e.target.value as Operation["kind"])}>
                      <option value="crew">Crew</option>
                      <option value="wait">Wait</option>
                    </select>
                  </div>
                  <button type="button" className="btn-secondary" onClick={addOperation}>
                    Add
                  </button>
                </div>
              </div>
            )}
          </section>

          <section className="card" aria-labelledby="links-panel-heading">
            <h3 id="links-panel-heading">Links</h3>
            <p className="mt-1 text-xs text-muted">Lag: how far (ft) and how long (h) the follower stays behind.</p>
            {links.length === 0 ? (
              <p className="mt-2 text-sm text-muted">No links: every operation may start at once.</p>
            ) : (
              <ul className="mt-2 space-y-3">
                {links.map((l: Link | LinkIn, i) => (
                  <li key={`${l.from}->${l.to}`} className="rounded-md border border-line p-2">
                    <p className="text-sm font-medium">
                      {label(l.from)} → {label(l.to)}
                    </p>
                    <div className="mt-1 flex items-end gap-2">
                      <NumberField name={`links.${i}.lagFt`} srPrefix={`${label(l.from)} → ${label(l.to)} `} label="lag (ft)" min={0} className="w-24" />
                      <NumberField name={`links.${i}.lagHours`} srPrefix={`${label(l.from)} → ${label(l.to)} `} label="lag (h)" min={0} className="w-24" />
                      {!readOnly && (
                        <button type="button" className="btn-danger" onClick={() => removeLinks([`${l.from}->${l.to}`])} aria-label={`Remove link ${label(l.from)} to ${label(l.to)}`}>
                          Remove
                        </button>
                      )}
                    </div>
                  </li>
                ))}
              </ul>
            )}
            {!readOnly && ops.length > 1 && (
              <div className="mt-4 border-t border-line pt-3">
                <h4 className="text-sm font-semibold">Add a link</h4>
                <div className="mt-2 flex flex-wrap items-end gap-2">
                  <div>
                    <label htmlFor="new-link-from" className="field-label">
                      From
                    </label>
                    <OperationSelect id="new-link-from" value={linkFrom} onChange={setLinkFrom} ops={ops} />
                  </div>
                  <div>
                    <label htmlFor="new-link-to" className="field-label">
                      To
                    </label>
                    <OperationSelect id="new-link-to" value={linkTo} onChange={setLinkTo} ops={ops} />
                  </div>
                  <button
                    type="button"
                    className="btn-secondary"
                    disabled={!linkFrom || !linkTo}
                    onClick={() => {
                      if (addLink(linkFrom, linkTo)) {
                        setLinkFrom("");
                        setLinkTo("");
                      }
                    }}
                  >
                    Link
                  </button>
                </div>
              </div>
            )}
          </section>
        </div>
      </div>
    </div>
  );
}
