/** The one screen: toolbar, result line, Decoders, Project and Glyphs on the left, Drawing, Budget and Comparison on the right. */
import { createEffect } from "solid-js";
import { app } from "../state/appState.ts";
import { BudgetPanel } from "./BudgetPanel.tsx";
import { CautionBanner } from "./CautionBanner.tsx";
import { ComparisonPanel } from "./ComparisonPanel.tsx";
import { DecoderPanel } from "./DecoderPanel.tsx";
import { ElectricalPanel } from "./ElectricalPanel.tsx";
import { DrawingPanel } from "./DrawingPanel.tsx";
import { GlyphEditor } from "./GlyphEditor.tsx";
import { InstrumentPanel } from "./InstrumentPanel.tsx";
import { NoticeBox } from "./NoticeBox.tsx";
import { PrintView } from "./PrintView.tsx";
import { ProjectPanel } from "./ProjectPanel.tsx";
import { ResultBar } from "./ResultBar.tsx";
import { Toolbar } from "./Toolbar.tsx";
import type { ExportKind } from "../files/exportFiles.ts";
import type { PaperName } from "../../render/drawingModel.ts";

/** CSS page-size names of the papers. */
const PAGE_SIZE: Readonly<Record<PaperName, string>> = { a4: "A4", a3: "A3", letter: "letter" };

const EXPORTS: readonly { kind: ExportKind; label: string }[] = [
  { kind: "svg", label: "SVG sheets" },
  { kind: "driver", label: "Driver stage sheet (SVG)" },
  { kind: "wiring", label: "Wiring CSV" },
  { kind: "wiring-page", label: "Wiring page (HTML)" },
  { kind: "bom", label: "Parts CSV" },
  { kind: "netlists", label: "SPICE netlists" },
  { kind: "budget", label: "Budget JSON" },
  { kind: "project", label: "Project JSON" },
];

export function App() {
  createEffect(() => {
    // @page cannot read a CSS variable, so the size rule is written here.
    let style = document.getElementById("page-size");
    if (!style) {
      style = document.createElement("style");
      style.id = "page-size";
      document.head.append(style);
    }
    // The sheets' own orientation: the layout picks the one that needs the fewest sheets.
    const orientation = app.drawing()?.sheets[0]?.orientation ?? "landscape";
    style.textContent = `@page { size: ${PAGE_SIZE[app.paper()]} ${orientation}; margin: 0; }`;
  });
  return (
    <div class="app" data-ready={app.ready() ? "yes" : "no"}>
      <div class="topbar">
        <Toolbar paper={app.paper()} onPaper={app.setPaper} exportKinds={EXPORTS} />
        <ResultBar />
      </div>
      <NoticeBox />
      <CautionBanner />
      <main class="workspace">
        <div class="col-left">
          <InstrumentPanel />
          <ProjectPanel />
          <ElectricalPanel />
          <DecoderPanel />
          <GlyphEditor />
        </div>
        <div class="col-right">
          <DrawingPanel />
          <div class="pair">
            <BudgetPanel />
            <ComparisonPanel />
          </div>
        </div>
      </main>
      <PrintView />
    </div>
  );
}
