/**
 * The answer at a glance for one site, above the fold: where the oval is
 * relative to the site, the line type, where to look, the conjugate point and
 * how far it moved since the previous answer, and the cautions.
 */
import { useMemo } from 'react';
import type { SitesResult } from '../../../workers/protocol';
import { useStore } from '../store';
import { fmtMlt } from '../lib/units';
import { MLT_LABEL_MAG } from '../../physics/mapping/cgm-model';
import { cgmSentence, groundDistanceKm, latLonText, lineSentence, lookSentence, ovalPlace, utcText } from './answer';
import { ui, useUi } from './selection';

/** Conjugate of each site in the previous and the current answer (by site name). */
const seen = new Map<string, { requestId: number; lat: number; lon: number; prev: { lat: number; lon: number } | null }>();

function record(res: SitesResult | null): void {
  // A table filled from the timeline is followed by the worker's own answer for the same inputs: count that one.
  if (!res || res.fromTimeline) return;
  for (const r of res.sites) {
    const old = seen.get(r.name);
    if (old && old.requestId === res.requestId) continue;
    if (!r.conjugate) {
      seen.delete(r.name);
      continue;
    }
    const now = { lat: r.conjugate.geoLatDeg, lon: r.conjugate.geoLonDeg };
    seen.set(r.name, { requestId: res.requestId, ...now, prev: old ? { lat: old.lat, lon: old.lon } : null });
  }
}

export function AnswerCard() {
  const sites = useStore((s) => s.sites);
  const res = useStore((s) => s.siteResults);
  const time = useStore((s) => s.conditions.time);
  const minEl = useStore((s) => s.products.minElevationDeg);
  const products = useStore((s) => s.products);
  const pending = useStore((s) => s.pending.sites);
  const chosen = useUi((s) => s.selectedSite);
  useMemo(() => record(res), [res]);
  const name = chosen != null && sites.some((s) => s.name === chosen) ? chosen : sites[0]?.name ?? null;
  const r = res?.sites.find((x) => x.name === name);
  const conjAltKm = (products as { conjugateAltKm?: number }).conjugateAltKm ?? 0;
  const moved = r?.conjugate ? seen.get(r.name)?.prev : null;
  const place = r ? ovalPlace(r) : null;
  return (
    <section className="panel answer" aria-labelledby="answer-h" aria-busy={pending}>
      <div className="answer-head">
        <h2 id="answer-h">At a glance</h2>
        {sites.length > 0 && (
          <label>
            <span className="sr">Site for the answer</span>
            <select aria-label="Site for the answer" value={name ?? ''} onChange={(e) => ui.set({ selectedSite: e.target.value })}>
              {sites.map((s, i) => <option key={`${i}-${s.name}`} value={s.name}>{s.name}</option>)}
            </select>
          </label>
        )}
        <span className="when">{utcText(time)}</span>
      </div>
      {!name && <p className="lead">Add a site (in the sites table below, or by clicking a polar map) to get an answer here.</p>}
      {name && !r && <p className="lead">Working out the answer for {name}…</p>}
      {r && place && (
        <>
          <p className="lead" data-answer="oval">{place.sentence}</p>
          <ul className="facts">
            <li data-answer="line">{lineSentence(r)}</li>
            <li data-answer="look">{lookSentence(r, minEl)}</li>
            <li data-answer="conjugate">
              {r.conjugate
                ? <>Conjugate point ({conjAltKm === 0 ? 'at the ground' : `at ${conjAltKm} km`}): {latLonText(r.conjugate.geoLatDeg, r.conjugate.geoLonDeg)}
                    {moved ? ` — ${Math.round(groundDistanceKm(moved.lat, moved.lon, r.conjugate.geoLatDeg, r.conjugate.geoLonDeg))} km from the previous answer.` : '.'}</>
                : 'No conjugate point (the line does not return to Earth).'}
            </li>
            <li className="dim" data-answer="magnetic">{cgmSentence(r.cgm)} Centred-dipole: magnetic latitude {Number.isFinite(r.magLatDeg) ? `${r.magLatDeg.toFixed(1)}°` : '–'}, {MLT_LABEL_MAG} {fmtMlt(r.mltHours)} (at the footpoint altitude).</li>
          </ul>
        </>
      )}
      <p className="fine">A simplified model, not a forecast: check an official space-weather forecast before you go, and follow local rules and landowners' wishes when out at night.</p>
    </section>
  );
}
