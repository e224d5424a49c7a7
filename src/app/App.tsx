/** Page layout: caution, controls, 3D view, polar maps, sites, sweep, exports. */
import { SceneView } from './scene/SceneView';
import { ConditionsPanel } from './panels/ConditionsPanel';
import { SitesPanel } from './panels/SitesPanel';
import { PolarMaps } from './panels/PolarMaps';
import { SweepPlot } from './panels/SweepPlot';
import { ExportPanel } from './panels/ExportPanel';
import { Caution } from './panels/Caution';
import { Warnings } from './panels/Warnings';
import { ViewBar } from './panels/ViewBar';
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
      <aside className="left">
        <ConditionsPanel />
      </aside>
      <main className="center">
        <Warnings />
        <div className="scene">
          <SceneView />
          <ViewBar />
        </div>
      </main>
      <div className="sites-area">
        <SitesPanel />
        <TimelinePanel />
      </div>
      <aside className="right">
        <PolarMaps />
        <SweepPlot />
        <ExportPanel />
      </aside>
    </div>
  );
}
