"use client";
import { useEffect, useMemo, useRef, useState } from "react";
import type { BaselineWithClasses } from "@/db/queries/baselines";
import type { StoredWireClass } from "@/db/queries/wire-classes";
import { ApiRequestError, apiSend, errorMessage, staleVersionOf } from "@/lib/api-client";
import { moveItem, stackNotes } from "@/lib/workspace/stack";
import { Card } from "@/components/ui/card";
import { CrossSection } from "./cross-section";
import { useWidth } from "./use-width";

const nm = (m: number) => `${Number((m * 1e9).toPrecision(3))} nm`;
const num = (v: number) => `${Number(v.toPrecision(3))}`;

/** Height of the drawing of one class at `scale` px/m (the CrossSection's own layout: ILD, line, ILD or headroom, labels). */
const vspanOf = (c: StoredWireClass) => (c.ildBelowM ?? c.thicknessM) + c.thicknessM + (c.ildAboveM ?? c.thicknessM * 1.2);
const hspanOf = (c: StoredWireClass) => (3 * c.widthM + 2 * c.spacingM) * 1.3;
/** The tallest drawing at one scale, px. */
const MAX_DRAWING_H = 340;
const MIN_DRAWING_H = 44;

/**
 * The baseline's classes as a metal stack, top layer first: each layer's cross-section (at one scale for all, or
 * each fitted), the notes on the interfaces between neighbours, and the layer order, changed by drag or by
 * "Move up/down" (buttons, Alt+↑/↓ on a layer) and written at once with the baseline's version.
 */
export function StackView({
  baseline,
  version,
  readOnly,
  locked,
  onSaved,
  onStale,
}: {
  baseline: BaselineWithClasses;
  version: number;
  readOnly: boolean;
  /** The class table has unsaved edits: the order cannot be written on its own. */
  locked: boolean;
  onSaved: (b: BaselineWithClasses) => void;
  onStale: (currentVersion: number) => void;
}) {
  const stored = baseline.classes;
  // The order being written (shown at once); otherwise the stored order.
  const [pending, setPending] = useState<string[] | null>(null);
  const [busy, setBusy] = useState(false);
  const [status, setStatus] = useState<{ tone: "good" | "bad"; text: string } | null>(null);
  const [oneScale, setOneScale] = useState(true);
  const [dragId, setDragId] = useState<string | null>(null);
  const [focusId, setFocusId] = useState<string | null>(null);
  const itemRefs = useRef(new Map<string, HTMLLIElement>());
  const [ref, width] = useWidth<HTMLDivElement>(900);

  const storedOrder = useMemo(() => stored.map((c) => c.id), [stored]);
  const order = pending ?? storedOrder;
  useEffect(() => {
    if (focusId) itemRefs.current.get(focusId)?.focus();
  }, [order, focusId]);

  const byId = useMemo(() => new Map(stored.map((c) => [c.id, c])), [stored]);
  const layers = order.map((id) => byId.get(id)).filter((c): c is StoredWireClass => !!c);
  const notes = useMemo(() => stackNotes(layers), [layers]);

  const wide = width >= 640;
  const drawW = Math.max(180, Math.min(wide ? width - 300 : width - 8, 620));
  const scale = useMemo(() => {
    if (!oneScale || layers.length === 0) return undefined;
    return Math.min(...layers.map((c) => Math.min((drawW - 20) / hspanOf(c), (MAX_DRAWING_H - 30) / (vspanOf(c) * 1.1))));
  }, [oneScale, layers, drawW]);

  // At one scale the drawings are as wide as the widest layer needs (no empty ILD beside narrow stacks).
  const shownW = scale && layers.length ? Math.min(drawW, Math.ceil(Math.max(...layers.map(hspanOf)) * scale + 24)) : drawW;
  const canMove = !readOnly && !locked && !busy;

  async function write(next: string[], movedId: string) {
    setPending(next);
    setFocusId(movedId);
    setBusy(true);
    setStatus(null);
    try {
      const classes = next.map((id) => {
        const { position: _p, histogramBins: _h, ...c } = byId.get(id)!;
        return c;
      });
      const r = await apiSend<{ baseline: BaselineWithClasses }>("PUT", `/api/baselines/${baseline.id}/classes`, { version, classes });
      onSaved(r.baseline);
      const moved = byId.get(movedId)?.name ?? "the layer";
      const at = next.indexOf(movedId);
      setStatus({ tone: "good", text: `Moved ${moved} to layer ${at + 1} from the bottom; saved as version ${r.baseline.version}.` });
    } catch (e) {
      const current = staleVersionOf(e);
      if (current !== null) {
        onStale(current);
        setStatus({
          tone: "bad",
          text: `Not saved: someone saved this baseline in the meantime (now version ${current}). Reload theirs, then move the layer again.`,
        });
      } else if (e instanceof ApiRequestError && e.isNetworkError) setStatus({ tone: "bad", text: "Could not reach the server; the order was not changed." });
      else setStatus({ tone: "bad", text: errorMessage(e, "Could not save the order.") });
    } finally {
      setPending(null);
      setBusy(false);
    }
  }

  /** Move the layer `id` by `d` positions up (+1, towards the top) or down (−1). */
  const move = (id: string, d: 1 | -1) => {
    const i = order.indexOf(id);
    const j = i + d;
    if (!canMove || i < 0 || j < 0 || j >= order.length) return;
    void write(moveItem(order, i, j), id);
  };

  const top = [...layers].reverse();
  return (
    <Card
      title="Stack"
      actions={
        <label className="no-print inline-flex items-center gap-1 text-xs text-ink">
          <input type="checkbox" checked={oneScale} onChange={(e) => setOneScale(e.target.checked)} data-testid="stack-one-scale" />
          One scale for all layers
        </label>
      }
    >
      <div ref={ref} data-testid="stack-view">
        <p className="mb-2 text-xs text-muted">
          The classes as metal layers, the top layer first (a class may stand for several layers of one tier).{" "}
          {oneScale && scale ? `Drawn to one scale: 100 nm = ${num(scale * 100e-9)} px.` : "Each layer fitted to its box (not to one scale)."}{" "}
          {readOnly
            ? ""
            : locked
              ? "Save or undo your edits in the class table to reorder layers here."
              : "Reorder by dragging a layer, with its Move up / Move down buttons, or Alt+↑ / Alt+↓ on a focused layer; each move is saved at once."}
        </p>
        {status ? (
          <p
            role={status.tone === "bad" ? "alert" : "status"}
            className={`mb-2 text-xs ${status.tone === "bad" ? "text-bad" : "text-good"}`}
            data-testid="stack-status"
          >
            {status.text}
          </p>
        ) : (
          <p role="status" className="sr-only" />
        )}
        {layers.length === 0 ? <p className="py-4 text-center text-sm text-muted">No classes yet.</p> : null}
        <ol className="space-y-0" aria-label="Metal layers, top first" data-testid="stack-layers">
          {top.map((c) => {
            const idx = order.indexOf(c.id); // from the bottom
            const note = notes.find((n) => n.below === idx - 1);
            const air = c.kGap !== undefined || c.gapFraction !== undefined;
            const airGap = air ? { kGap: c.kGap ?? 1, gapFraction: c.gapFraction ?? 1 } : null;
            const h = scale ? Math.max(MIN_DRAWING_H, Math.round(vspanOf(c) * scale * 1.1 + 30)) : 150;
            return (
              <li
                key={c.id}
                ref={(el) => {
                  if (el) itemRefs.current.set(c.id, el);
                  else itemRefs.current.delete(c.id);
                }}
                tabIndex={0}
                aria-label={`Layer ${idx + 1} from the bottom: ${c.name}`}
                data-testid="stack-layer"
                data-class={c.name}
                draggable={canMove}
                onDragStart={(e) => {
                  setDragId(c.id);
                  e.dataTransfer.effectAllowed = "move";
                  e.dataTransfer.setData("text/plain", c.name);
                }}
                onDragEnd={() => setDragId(null)}
                onDragOver={(e) => {
                  if (dragId && dragId !== c.id) e.preventDefault();
                }}
                onDrop={(e) => {
                  e.preventDefault();
                  if (!dragId || dragId === c.id || !canMove) return;
                  const from = order.indexOf(dragId);
                  void write(moveItem(order, from, idx), dragId);
                  setDragId(null);
                }}
                onKeyDown={(e) => {
                  if (!e.altKey || (e.key !== "ArrowUp" && e.key !== "ArrowDown")) return;
                  e.preventDefault();
                  move(c.id, e.key === "ArrowUp" ? 1 : -1);
                }}
                className={`rounded-md outline-none focus-visible:ring-2 focus-visible:ring-copper/40 ${dragId === c.id ? "opacity-50" : ""}`}
              >
                <div className={`grid gap-2 border-t border-rule py-2 ${wide ? "grid-cols-[17rem_1fr]" : "grid-cols-1"}`}>
                  <div className="flex min-w-0 items-start gap-2">
                    {canMove ? (
                      <span aria-hidden="true" className="mt-0.5 cursor-grab select-none text-faint" title="Drag to reorder">
                        ⋮⋮
                      </span>
                    ) : null}
                    <div className="min-w-0 flex-1">
                      <p className="text-sm font-semibold text-ink">
                        <span className="tabular mr-1 text-xs font-normal text-muted">L{idx + 1}</span>
                        {c.name} <span className="text-xs font-normal text-muted">{c.tier}</span>
                      </p>
                      <p className="tabular text-xs text-muted">
                        pitch {nm(c.widthM + c.spacingM)} · AR {num(c.thicknessM / c.widthM)} · {c.metal}
                        {c.barrierM > 0 ? ` + ${nm(c.barrierM)} barrier` : ", no barrier"} · k {num(c.k)}
                        {airGap ? ` · air gap k ${num(airGap.kGap)} to ${num(100 * airGap.gapFraction)}% of T` : ""}
                      </p>
                      <p className="tabular text-xs text-muted">
                        ILD below {c.ildBelowM !== null ? nm(c.ildBelowM) : "none (no plane)"} · above{" "}
                        {c.ildAboveM !== null ? nm(c.ildAboveM) : "none (no plane)"}
                      </p>
                      {!readOnly ? (
                        <div className="no-print mt-1 flex gap-1">
                          <button
                            type="button"
                            className="rounded border border-rule px-1.5 py-0.5 text-xs text-ink hover:bg-rule/50 disabled:opacity-40"
                            aria-label={`Move layer ${c.name} up`}
                            disabled={!canMove || idx === order.length - 1}
                            onClick={() => move(c.id, 1)}
                          >
                            Move up
                          </button>
                          <button
                            type="button"
                            className="rounded border border-rule px-1.5 py-0.5 text-xs text-ink hover:bg-rule/50 disabled:opacity-40"
                            aria-label={`Move layer ${c.name} down`}
                            disabled={!canMove || idx === 0}
                            onClick={() => move(c.id, -1)}
                          >
                            Move down
                          </button>
                        </div>
                      ) : null}
                    </div>
                  </div>
                  <div className="min-w-0 overflow-hidden">
                    <CrossSection
                      label={c.name}
                      widthM={c.widthM}
                      thicknessM={c.thicknessM}
                      spacingM={c.spacingM}
                      heightBelowM={c.ildBelowM ?? c.thicknessM}
                      heightAboveM={c.ildAboveM}
                      barrierM={c.barrierM}
                      k={c.k}
                      airGap={airGap}
                      width={shownW}
                      height={h}
                      scale={scale}
                    />
                  </div>
                </div>
                {note ? (
                  <p className="mb-1 rounded bg-warn-soft px-2 py-1 text-xs text-warn" data-testid="stack-note">
                    {note.text}
                  </p>
                ) : null}
              </li>
            );
          })}
        </ol>
        {layers.length > 1 && notes.length === 0 ? (
          <p className="mt-2 text-xs text-good" data-testid="stack-consistent">
            Every layer&apos;s ILD above equals the ILD below of the layer over it.
          </p>
        ) : null}
      </div>
    </Card>
  );
}
