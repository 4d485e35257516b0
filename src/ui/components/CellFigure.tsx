/**
 * A drawn display cell. Interactive in the glyph editor (each segment a
 * toggle button reachable by Tab, Enter or Space), static in previews.
 */
import { For, Show } from "solid-js";
import type { CellFigure as Figure, CellKind } from "../../core/project/project.ts";
import { cellShapes, type DrawnSegment } from "./cellShapes.ts";

export interface CellFigureProps {
  readonly kind: CellKind;
  readonly segments: readonly string[];
  /** A custom cell's own figure, when it gives one. */
  readonly figure?: Figure | undefined;
  readonly lit: readonly string[];
  /** Height in CSS pixels. */
  readonly height: number;
  readonly onToggle?: (segment: string) => void;
  readonly labels?: boolean;
  readonly title?: string;
}

export function CellFigure(props: CellFigureProps) {
  const drawing = () => cellShapes({ kind: props.kind, segments: props.segments, figure: props.figure });
  const shapes = () => drawing().shapes;
  const isLit = (s: string) => props.lit.includes(s);
  const interactive = () => props.onToggle !== undefined;
  const keydown = (e: KeyboardEvent, s: string) => {
    if (e.key === "Enter" || e.key === " ") {
      e.preventDefault();
      props.onToggle?.(s);
    }
  };
  const shape = (sh: DrawnSegment) => {
    const common = {
      class: `seg ${isLit(sh.segment) ? "seg-on" : "seg-off"}`,
      "data-segment": sh.segment,
    };
    return sh.kind === "polygon" ? <polygon {...common} points={sh.points} /> : <circle {...common} cx={sh.cx} cy={sh.cy} r={sh.r} />;
  };
  return (
    <svg
      class={`cell ${interactive() ? "cell-edit" : ""}`}
      viewBox={`-4 -4 ${drawing().width + 8} ${drawing().height + 8}`}
      height={props.height}
      width={(props.height * (drawing().width + 8)) / (drawing().height + 8)}
      role={interactive() ? "group" : "img"}
      aria-label={props.title ?? `cell lighting ${props.lit.join(" ") || "nothing"}`}
    >
      <For each={shapes()}>
        {(sh) =>
          interactive() ? (
            <g
              class="seg-button"
              tabindex="0"
              role="switch"
              aria-checked={isLit(sh.segment)}
              aria-label={`segment ${sh.segment}`}
              onClick={() => props.onToggle?.(sh.segment)}
              onKeyDown={(e) => keydown(e, sh.segment)}
            >
              {shape(sh)}
              <Show when={props.labels}>
                <text
                  class={`seg-label ${sh.labelInside && isLit(sh.segment) ? "on" : ""}`}
                  x={sh.labelX}
                  y={sh.labelY + 2}
                  text-anchor="middle"
                >
                  {sh.segment}
                </text>
              </Show>
            </g>
          ) : (
            shape(sh)
          )
        }
      </For>
    </svg>
  );
}
