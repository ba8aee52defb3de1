/**
 * The setup sheet: one print-ready page (Letter and A4) for the operator, rendered on the server
 * with react-dom/server's renderToStaticMarkup, which escapes every text and attribute value, so
 * names typed by users (job, part, placements, bar ids) reach the page as text, never as markup.
 * The station map is the SVG the DXF writer's sibling draws (server/dxf/drawing-svg.ts), inserted
 * as it is: it is markup Gridset writes, with its own text escaped there.
 */
import { renderToStaticMarkup } from 'react-dom/server';
import type { JobDetail } from '../../shared/schemas/job';
import type { TemplateVersion } from '../../shared/schemas/template-api';
import { componentLayer } from '../../shared/interchange/drawing-layers';
import { formatLength, formatNumber } from '../../shared/units/units';
import { reasonText, STOCK_CHECK_ADVICE } from '../../shared/clamps/reason-text';
import { draftMark } from '../../shared/interchange/draft-mark';
import { drawingToSvg } from '../dxf/drawing-svg';
import { jobDrawing, unusedStations, usedVersion } from './job-drawing';

export const CAUTIONS = [
  'This sheet is advice computed from the entered template, clamp models and measurements; it is not a guarantee that the setup holds.',
  'Check every clamp and its torque before cycle start, and prove the first cycle at reduced rapid and feed.',
  'Check the offset file against your control’s programming manual before running it.',
  'Follow the machine builder’s instructions, your shop’s procedures, local codes and licensed practice.',
];

const STYLE = `
  @page { margin: 12mm; }
  body { font: 11pt/1.4 system-ui, sans-serif; color: #000; background: #fff; margin: 0; }
  h1 { font-size: 18pt; margin: 0 0 4pt; } h2 { font-size: 13pt; margin: 14pt 0 6pt; border-bottom: 1px solid #000; }
  table { border-collapse: collapse; width: 100%; font-size: 10pt; } th, td { border: 1px solid #555; padding: 2pt 4pt; text-align: left; }
  td.n { text-align: right; font-family: ui-monospace, monospace; font-variant-numeric: tabular-nums; white-space: nowrap; }
  .page { break-before: page; } svg { width: 100%; height: auto; max-height: 160mm; }
  .caution { border: 2px solid #000; padding: 6pt; margin-top: 10pt; } .box { display: inline-block; width: 10pt; height: 10pt; border: 1px solid #000; margin-right: 6pt; }
  table.signoff th { width: 16%; } table.signoff td { height: 28pt; width: 34%; }
  .draft-mark { border: 3pt solid #000; padding: 6pt 8pt; margin: 0 0 10pt; font-weight: 700; font-size: 12pt; overflow-wrap: anywhere; }
  .draft-mark span { display: block; font-size: 9pt; font-weight: 400; }
  footer { font-size: 8pt; border-top: 1px solid #000; padding-top: 2pt; margin-top: 12pt; overflow-wrap: anywhere; }
  /*
   * The footer stays in the flow, after the last line, on screen and on paper, so it never lies over a
   * table. On paper each page's foot also carries the version and hash in the page's own margin
   * (CSS Paged Media Level 3, page-margin boxes), which page content cannot reach.
   */
  @media screen { body { max-width: 60rem; margin: 1rem auto; padding: 0 1rem; } }
  svg { max-width: 100%; }
  /*
   * On a phone (DESIGN.md, "At the machine": nothing scrolled sideways) each row of a data table becomes a
   * block of "label value" lines, the label from the cell's data-label; on paper and at a desk, a table.
   */
  @media screen and (max-width: 40rem) {
    table:not(.signoff), table:not(.signoff) tbody, table:not(.signoff) tr, table:not(.signoff) td { display: block; }
    table:not(.signoff) thead { display: none; }
    table:not(.signoff) tr { border: 1px solid #555; margin-bottom: 6pt; padding: 2pt 0; }
    table:not(.signoff) td { border: 0; display: flex; justify-content: space-between; gap: 8pt; text-align: right; white-space: normal; }
    table:not(.signoff) td::before { content: attr(data-label); font-family: system-ui, sans-serif; font-weight: 600; text-align: left; }
  }
`;

type StockCheck = JobDetail['stockChecks'][number];

/** The latest stock check: which rails were checked (each against its own clamp) and which were not. */
function StockCheckSection({ job, latest }: { job: JobDetail; latest: StockCheck }) {
  const rails = latest.rails.length ? latest.rails : [{ jawPlacement: latest.jawPlacement, jawComponent: '', nominalOpening: latest.nominalOpening, appliesTo: latest.appliesTo, result: latest.result }];
  const checked = new Set(rails.map((r) => r.jawPlacement));
  const notChecked = job.railsUsed.filter((r) => !checked.has(r));
  return (
    <>
      <p>
        {`Latest check (${latest.at}${latest.by ? `, ${latest.by}` : ''}): ${latest.bars.length} bars. Rails checked: ${rails.map((r) => r.jawPlacement).join(', ')}. `}
        {notChecked.length ? <><b>{`Rails not checked: ${notChecked.join(', ')}`}</b>; check the bars against them before loading.</> : 'Every rail the job uses was checked.'}
      </p>
      {rails.map((r) => (
        <section key={r.jawPlacement}>
          <h3>{`${r.jawPlacement}${r.jawComponent ? ` (${r.jawComponent})` : ''}, nominal opening ${formatLength(r.nominalOpening, latest.unit)}`}</h3>
          <table>
            <thead><tr><th>Rail setting</th><th>Shift</th><th>Bars</th></tr></thead>
            <tbody>
              {r.result.settings.map((s, i) => (
                <tr key={i}><td data-label="Rail setting">{`Setting ${i + 1}`}</td><td data-label="Shift" className="n">{`${s.shift >= 0 ? '+' : ''}${formatLength(s.shift, latest.unit)}`}</td><td data-label="Bars">{s.bars.join(', ')}</td></tr>
              ))}
            </tbody>
          </table>
          {r.result.unplaceable.length ? (
            <p><b>Cannot be used on this rail:</b>{' '}{r.result.unplaceable.map((id) => {
              const b = r.result.bars.find((x) => x.id === id);
              return `${id} (${(b?.reasons ?? []).map((x) => reasonText(x)).join('; ')})`;
            }).join(', ')}</p>
          ) : null}
        </section>
      ))}
    </>
  );
}

/**
 * A version that is not released says so first, in the same words as every other file written from it
 * (shared/interchange/draft-mark.ts), on screen and at the head of the printed sheet.
 */
function DraftBanner({ v }: { v: TemplateVersion }) {
  const mark = draftMark(v);
  if (!mark) return null;
  return (
    <p className="draft-mark" role="note" data-draft-state={v.state} data-content-hash={v.contentHash}>
      {mark}
      <span>{`${v.name} version ${v.version} is ${v.state}, not released: do not set up production from this sheet.`}</span>
    </p>
  );
}

/**
 * A CSS string literal (CSS Syntax Level 3, §4.3.5: a backslash and hex digits escape any code point).
 * `<`, `>` and `&` are escaped too, so a typed name can never close the <style> element it sits in.
 */
const cssString = (s: string) => `"${s.replace(/["\\\n\r\f<>&]/g, (c) => `\\${c.charCodeAt(0).toString(16)} `)}"`;

/** The foot of every printed page, in the page margin so it never covers a table (CSS Paged Media Level 3, §5 page-margin boxes). */
function pageFoot(v: TemplateVersion, printed: string): string {
  const text = `${draftMark(v) ?? `${v.name} v${v.version} · content hash ${v.contentHash}`} · printed ${printed}`;
  return `\n  @page { margin-bottom: 16mm; @bottom-left { content: ${cssString(text)}; font: 7pt system-ui, sans-serif; } @bottom-right { content: "page " counter(page) " of " counter(pages); font: 7pt system-ui, sans-serif; } }\n`;
}

function offsetPlace(v: TemplateVersion): string {
  const o = v.sharedOffset;
  if (o.kind === 'hole') return `grid hole (${o.hole.col}, ${o.hole.row})`;
  if (o.kind === 'center') return 'the center of the hole grid';
  return `the point (${formatLength(o.x, v.unit)}, ${formatLength(o.y, v.unit)})`;
}

export function SetupSheet({ job, v, svg, printed }: { job: JobDetail; v: TemplateVersion; svg: string; printed: string }) {
  const u = v.unit;
  const used = usedVersion(job, v);
  const unused = unusedStations(job, v);
  const byCode = new Map(v.components.map((c) => [c.code, c]));
  const latest = job.stockChecks[0];
  const clamps = v.placements.filter((p) => byCode.get(p.component)?.clamp);
  return (
    <html lang="en">
      <head>
        <meta charSet="utf-8" />
        <title>{`${draftMark(v) ? 'NOT RELEASED · ' : ''}Setup sheet — ${job.name}`}</title>
        <style dangerouslySetInnerHTML={{ __html: STYLE + pageFoot(v, printed) }} />
      </head>
      <body>
        <DraftBanner v={v} />
        <h1>{`Setup sheet — ${job.name}`}</h1>
        <p>
          Part <b>{job.partNumber}</b>{job.partRevision ? ` rev ${job.partRevision}` : ''}{' · template '}<b>{v.name}</b>
          {` version ${v.version} (${v.state}) on plate `}<b>{v.plate.code}</b>
          {`, pitch ${formatLength(v.plate.pitch, v.plate.unit)}, ${v.plate.columns} × ${v.plate.rows} holes.`}
        </p>
        <p>
          Shared work offset <b>{v.sharedOffset.name ?? 'shared offset'}</b>{` at ${offsetPlace(v)}. `}
          {`Stock ${formatLength(job.stock.width, u)} × ${formatLength(job.stock.thickness, u)} × ${formatLength(job.stock.length, u)} ${job.stock.material}; `}
          {`carrier ${formatLength(job.carrier, u)}, tool clearance ${formatLength(job.clearance, u)}, minimum bite ${formatLength(job.minBite, u)}.`}
        </p>
        <p>{`Stations used: ${used.stations.length} of ${v.stations.length} (the stations whose width held accepts the stock width)${unused.length ? `; not used by this job: ${unused.map((s) => s.number).join(', ')}` : ''}.`}</p>
        <p>{`Runtime: ${used.stations.length} stations × ${job.cycleMinutes} min + ${job.loadMinutes} min load = `}<b>{`${formatNumber(job.runtimeMinutes, 'mm')} min`}</b> unattended.</p>
        {job.problems.length ? (
          <div className="caution"><b>Job problems.</b><ul>{job.problems.map((p, i) => <li key={i}>{p.message}</li>)}</ul></div>
        ) : null}
        <h2>Station map</h2>
        <div dangerouslySetInnerHTML={{ __html: svg }} />
        <h2 className="page">Placements</h2>
        <table>
          <thead><tr><th>Placement</th><th>Component</th><th>Grid hole</th><th>Rotation</th><th>Layer</th><th>Stops in use</th></tr></thead>
          <tbody>
            {v.placements.map((p) => {
              const c = byCode.get(p.component);
              return (
                <tr key={p.id}>
                  <td data-label="Placement">{p.id}</td><td data-label="Component">{p.component}</td><td data-label="Grid hole" className="n">{`(${p.hole.col}, ${p.hole.row})`}</td><td data-label="Rotation" className="n">{`${p.rotation}°`}</td>
                  <td data-label="Layer">{c ? componentLayer(c) : ''}</td><td data-label="Stops in use">{(p.stopsInUse ?? []).map((s) => s + 1).join(', ') || '—'}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
        <h2>{`Stations (translation from the shared offset, ${u})`}</h2>
        <p>Z0 is the shared offset&apos;s Z0 (the plate deck under a grid-hole or center offset); each station&apos;s Z is its part seat above it.</p>
        <table>
          <thead><tr><th>Station</th><th>X</th><th>Y</th><th>Z</th><th>C</th><th>Width held</th><th>Placement</th></tr></thead>
          <tbody>
            {used.stations.map((s) => (
              <tr key={s.number}>
                <td data-label="Station" className="n">{s.number}</td><td data-label="X" className="n">{formatNumber(s.x, u)}</td><td data-label="Y" className="n">{formatNumber(s.y, u)}</td><td data-label="Z" className="n">{formatNumber(s.z, u)}</td>
                <td data-label="C" className="n">{`${formatNumber(s.c, 'mm')}°`}</td><td data-label="Width held" className="n">{s.nominalWidth === null ? '—' : formatNumber(s.nominalWidth, u)}</td><td data-label="Placement">{s.placement}</td>
              </tr>
            ))}
          </tbody>
        </table>
        <h2 className="page">Stock check</h2>
        {latest ? <StockCheckSection job={job} latest={latest} /> : <p>{`No bars have been checked for this job yet. Rails to check: ${job.railsUsed.join(', ') || 'none'}.`}</p>}
        <h2>Clamp check list</h2>
        {clamps.length
          ? clamps.map((p) => <p key={p.id}><span className="box" />{`${p.id} (${p.component}): every clamp seated on the stock and torqued to the clamp maker's value; rail bolts tight.`}</p>)
          : <p>No clamping components.</p>}
        <p><span className="box" />A few stations probed against the table; all within the probe-check tolerance.</p>
        <h2>Sign-off</h2>
        <table className="signoff" aria-label="Sign-off">
          <tbody>
            <tr><th scope="row">Prepared by</th><td /><th scope="row">Date</th><td /></tr>
            <tr><th scope="row">Checked by</th><td /><th scope="row">Date</th><td /></tr>
          </tbody>
        </table>
        <div className="caution"><b>Cautions.</b><ul>{[...CAUTIONS, STOCK_CHECK_ADVICE].map((c) => <li key={c}>{c}</li>)}</ul></div>
        <footer>{`${draftMark(v) ?? `${v.name} v${v.version} · content hash ${v.contentHash}`} · printed ${printed} · Gridset`}</footer>
      </body>
    </html>
  );
}

/** The setup sheet as a whole HTML document. */
export function setupSheetHtml(job: JobDetail, v: TemplateVersion): string {
  const svg = drawingToSvg(jobDrawing(job, v), { widthPx: 900, background: '#ffffff', title: `${job.name}: stations on ${v.plate.code}` });
  const printed = new Date().toISOString().slice(0, 10);
  return `<!doctype html>\n${renderToStaticMarkup(<SetupSheet job={job} v={v} svg={svg} printed={printed} />)}`;
}
