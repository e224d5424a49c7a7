/**
 * Page layout. Wide screens: controls | answer card, 3D view, sites | maps,
 * sweep, exports. Medium: controls | answer, view, sites, then the maps row.
 * Phones: one column (answer, 3D view full width, sites, controls, maps).
 */
import { SceneView } from './scene/SceneView';
import { ConditionsPanel } from './panels/ConditionsPanel';
import { SitesPanel } from './panels/SitesPanel';
import { PolarMaps } from './panels/PolarMaps';
import { SweepPlot } from './panels/SweepPlot';
import { ExportPanel } from './panels/ExportPanel';
import { Caution } from './panels/Caution';
import { Warnings } from './panels/Warnings';
import { ViewBar } from './panels/ViewBar';
import { AnswerCard } from './panels/AnswerCard';
import { KeyHelp } from './panels/KeyHelp';
import { TimelinePanel } from './panels/TimelinePanel';
import { useStore } from './store';

export function App() {
  const scenario = useStore((s) => s.scenarioName);
  return (
    <div className="app">
      <header>
        <h1>Fieldline Atlas</h1>
        <span className="scenario">{scenario}</span>
        <Caution />
      </header>
      <main className="center">
        <AnswerCard />
        <Warnings />
        <div className="scene">
          <ViewBar />
          <SceneView />
          <KeyHelp />
        </div>
        <div className="sites-area">
          <SitesPanel />
          <TimelinePanel />
        </div>
      </main>
      <aside className="left" aria-label="Conditions and model settings">
        <ConditionsPanel />
      </aside>
      <aside className="right" aria-label="Maps, sweep and exports">
        <PolarMaps />
        <SweepPlot />
        <ExportPanel />
      </aside>
    </div>
  );
}
