/** The app timeline's loading (series → steps, storm index through the series) and its export, in Node. */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadSeriesBlob, loadSeriesText, seriesSummary } from '../../src/app/timeline/load';
import { timelineCsv, timelineFileName, timelineJson, TIMELINE_COLUMNS } from '../../src/app/timeline/export';
import { nightTimesMs } from '../../src/app/timeline/steps';
import { integrateDstStar, dstFromCorrected, pressureCorrectedDst } from '../../src/physics/field/storm-index';
import { readCsvTable } from '../../src/io/csv';
import { createEngineApi } from '../../workers/engine-api';
import { expectClose } from '../helpers';

const EXAMPLES = resolve(import.meta.dirname, '../../examples');

describe('timeline loading', () => {
  it('the demo storm CSV: 72 hourly steps, index given, Dst down to about −300 nT', async () => {
    const s = await loadSeriesText('demo-storm.csv', readFileSync(resolve(EXAMPLES, 'demo-storm.csv'), 'utf8'));
    expect(s.format).toBe('csv');
    expect(s.steps.length).toBe(72);
    expect(s.cadenceMs).toBe(3_600_000);
    expect(s.steps.every((x) => x.dstSource === 'given')).toBe(true);
    const min = Math.min(...s.steps.map((x) => x.dstNt));
    expect(min).toBeLessThan(-280);
    expect(min).toBeGreaterThan(-350);
    expect(seriesSummary(s)).toMatch(/^72 steps every 1 h from demo-storm\.csv \(csv\), 2027-10-14 00:00 – 2027-10-16 23:00 UTC; storm index from the file\.$/);
  });

  it('the hand-made hourly file through a Blob stream: fill value skipped with its line number, rest kept', async () => {
    const text = readFileSync(resolve(EXAMPLES, 'demo-storm-hourly.txt'), 'utf8');
    // Small chunks through the browser path (Blob.stream()).
    const s = await loadSeriesBlob(new Blob([text]), 'demo-storm-hourly.txt');
    expect(s.format).toBe('hourly');
    expect(s.steps.length).toBe(23);
    expect(s.skipped).toEqual([{ line: 10, text: expect.stringMatching(/word 17 \(Bz GSM\) is a fill value/) }]);
    // The same hours as the CSV (our numbers written in both layouts): Bz and Dst agree.
    const csv = await loadSeriesText('c', readFileSync(resolve(EXAMPLES, 'demo-storm.csv'), 'utf8'));
    for (const st of s.steps) {
      const c = csv.steps.find((x) => x.time === st.time)!;
      expectClose(st.bzNt, c.bzNt, 0, `Bz at ${st.time}`);
      expectClose(st.dstNt, c.dstNt, 0, `Dst at ${st.time}`);
    }
  });

  it('without an index column the index is integrated through the series (O\'Brien–McPherron, references §10), restarting at given values', async () => {
    const rows = ['time,pdyn_npa,speed_kms,bz_nt,by_nt,dst_nt'];
    const t0 = Date.UTC(2027, 9, 14);
    const bz = [2, -10, -15, -15, -5, 0, 3, 3];
    bz.forEach((b, i) => rows.push(`${new Date(t0 + i * 3_600_000).toISOString().slice(0, 19)}Z,4,600,${b},1,${i === 5 ? -120 : ''}`));
    const s = await loadSeriesText('x.csv', rows.join('\n'));
    expect(s.steps.map((x) => x.dstSource)).toEqual(['estimated', 'estimated', 'estimated', 'estimated', 'estimated', 'given', 'estimated', 'estimated']);
    // Before the given value: the integral of the project's storm-index module from the first row's steady state.
    const times = s.steps.map((x) => x.ms);
    const star = integrateDstStar(times.slice(0, 5), Array(5).fill(600), bz.slice(0, 5), integrateDstStar([0, 1e12], [600, 600], [bz[0], bz[0]])[1]);
    for (let i = 1; i < 5; i++) expectClose(s.steps[i].dstNt, Math.round(dstFromCorrected(star[i], 4) * 10) / 10, 0.05, `estimated Dst at step ${i}`);
    // After it: restarted from the given value's Dst*.
    const after = integrateDstStar(times.slice(5), Array(3).fill(600), bz.slice(5), pressureCorrectedDst(-120, 4));
    for (let i = 1; i < 3; i++) expectClose(s.steps[5 + i].dstNt, Math.round(dstFromCorrected(after[i], 4) * 10) / 10, 0.05, `Dst after the given value, step ${5 + i}`);
  });

  it('bad lines are reported by number and the rest kept; a time that does not increase is dropped with a reason', async () => {
    const text = 'time,pdyn_npa,bz_nt\n2027-10-14T00:00:00Z,2,-3\n2027-10-14T01:00:00Z,abc,-3\n2027-10-13T23:30:00Z,2,-3\n2027-10-14T02:00:00Z,2,-4\n';
    const s = await loadSeriesText('bad.csv', text);
    expect(s.steps.map((x) => x.time)).toEqual(['2027-10-14T00:00:00Z', '2027-10-14T02:00:00Z']);
    expect(s.errors.map((e) => e.line)).toEqual([3, 4]);
    expect(s.errors[1].text).toMatch(/line 4: time 2027-10-13T23:30:00Z is not after the previous step/);
    await expect(loadSeriesText('junk.txt', 'hello world\n')).rejects.toThrow(/series/);
  });

  it('a night plan: the chosen length at the chosen step, both ends included', () => {
    const c = { time: '2027-10-14T18:20:00Z', pdynNpa: 2, bzNt: -3, byNt: 0, internal: 'dipole' as const, magnetopause: true, imfEfficiency: 0.2 };
    const t = nightTimesMs({ startIso: '', hours: 12, stepMin: 30 }, c);
    expect(t.length).toBe(25);
    expect(new Date(t[0]).toISOString()).toBe('2027-10-14T18:00:00.000Z');
    expect(new Date(t[24]).toISOString()).toBe('2027-10-15T06:00:00.000Z');
  });
});

describe('timeline export', () => {
  it('CSV with # metadata and JSON: one row per site per step, time and conditions columns, time-stamped name', async () => {
    const api = createEngineApi();
    const steps = [
      { time: '2027-10-14T20:00:00Z', pdynNpa: 3, bzNt: -8, byNt: 1, dstNt: -60, speedKms: 500 },
      { time: '2027-10-14T20:30:00Z', pdynNpa: 3.5, bzNt: -10, byNt: 1, dstNt: -80, speedKms: 520 },
    ];
    const sites = [{ name: 'Varn Ridge', latDeg: 66.5, lonDeg: 18.2 }, { name: '=Odd, "name"', latDeg: 62, lonDeg: -20 }];
    const base = { ...steps[0], internal: 'dipole' as const, magnetopause: true, imfEfficiency: 0.2, tail: true };
    const r = await api.timeline(1, base, steps, { altKm: 110, sourceRe: 8, sunLimitDeg: -18 }, sites);
    const meta = { generator: 'test', version: '0', createdUtc: '2027-01-01T00:00:00Z', source: 'night plan', model: { internal: 'dipole', magnetopause: true, imfEfficiency: 0.2, tail: true, tiltDeg: null }, products: { altKm: 110, sourceRe: 8, minLatDeg: 30, minElevationDeg: 10, conjugateAltKm: 0 }, sunLimitDeg: -18 };
    const csv = timelineCsv(meta, steps, r);
    const lines = csv.split('\r\n');
    expect(lines.filter((l) => l.startsWith('#')).some((l) => l === '# dark_sky: sun_elevation_below_deg=-18')).toBe(true);
    const t = readCsvTable(lines.filter((l) => !l.startsWith('#')).join('\r\n'));
    expect(t.header).toEqual([...TIMELINE_COLUMNS]);
    expect(t.records.length).toBe(4);
    expect(t.records.map((x) => `${x.time}|${x.site}`)).toEqual([
      '2027-10-14T20:00:00Z|Varn Ridge', '2027-10-14T20:00:00Z|=Odd, "name"', '2027-10-14T20:30:00Z|Varn Ridge', '2027-10-14T20:30:00Z|=Odd, "name"',
    ]);
    expect(t.records[2].dst_nt).toBe('-80');
    expect(t.records[2].dst_source).toBe('given');
    expect(t.records[0].dark).toBe(String(r.sites[0].cells[0].dark));
    const j = timelineJson(meta, steps, r) as { rows: Record<string, unknown>[] };
    expect(j.rows.length).toBe(4);
    expect(j.rows[3].speed_kms).toBe(520);
    expect(timelineFileName(steps, 'csv')).toBe('fieldline-atlas-timeline-20271014T2000Z-20271014T2030Z.csv');
    expect(timelineFileName(steps.slice(0, 1), 'json')).toBe('fieldline-atlas-timeline-20271014T2000Z.json');
  });
});

describe('timeline cursor', () => {
  it('sets the app conditions from the series row, and in a night keeps the night where it started', async () => {
    const { store } = await import('../../src/app/store');
    const { timelineStore } = await import('../../src/app/timeline/state');
    const { moveCursor, unloadSeries } = await import('../../src/app/timeline/actions');
    const series = await loadSeriesText('demo-storm.csv', readFileSync(resolve(EXAMPLES, 'demo-storm.csv'), 'utf8'));
    timelineStore.set({ series });
    moveCursor(22);
    const c = store.get().conditions;
    const row = series.steps[22];
    expect([c.time, c.pdynNpa, c.bzNt, c.byNt, c.dstNt, c.speedKms]).toEqual([row.time, row.pdynNpa, row.bzNt, row.byNt, row.dstNt, row.speedKms]);
    moveCursor(500);
    expect(timelineStore.get().cursor).toBe(71);
    unloadSeries();
    // Night: from the current time's hour (2027-10-16T23:00Z after the last step), 30-min steps.
    moveCursor(3);
    expect(store.get().conditions.time).toBe('2027-10-17T00:30:00Z');
    moveCursor(5);
    expect(store.get().conditions.time).toBe('2027-10-17T01:30:00Z');
    expect(timelineStore.get().night.startIso).toBe('2027-10-16T23:00:00Z');
  });
});
