// The yearly digest as one document: the web page (/digest/:year, the secretary's preview) and the
// PDF print the same markup with the same style sheet (./digest-style.ts).
import { cautionsFor } from "~/domain/cautions";
import { DIGEST_LARGE_ENTRIES, digestTitle, formatDigestDate, type DigestEntry, type DigestSnapshot } from "~/domain/digest";
import { layoutBarChart } from "~/domain/digest-chart";
import { hullBesideCredit } from "~/domain/hulls";
import { formatDimensions } from "~/domain/units";

export type DigestDocumentProps = {
  snapshot: DigestSnapshot;
  className: string;
  /** The app's public address, printed beside each write-up so paper readers can find it. */
  appUrl: string;
  /** Where an image is fetched from: /media/<key> on the web, a data: URL in the PDF. */
  photoSrc: (key: string) => string | null;
  /** A draft in preview: marked as such on every page it could be printed from. */
  draft?: boolean;
  /** Inside a page that has its own h1 (the preview): the cover's title is an h2. */
  embedded?: boolean;
};

function plural(n: number, one: string, many = `${one}s`) {
  return `${n.toLocaleString("en-GB")} ${n === 1 ? one : many}`;
}

/** Text that does not break across lines (unbreakable spaces). */
function keepTogether(text: string): string {
  return text.replace(/ /g, "\u00a0");
}

function hostAndPath(appUrl: string, path: string): string {
  const url = new URL(path, appUrl);
  return `${url.host}${url.pathname}`;
}

/** A line drawing of a small sloop under sail, for the cover (decoration only). */
function CoverSloop() {
  return (
    <svg viewBox="0 0 300 250" aria-hidden="true" focusable="false">
      <g fill="none" stroke="#1d4a58" strokeWidth="2" strokeLinejoin="round" strokeLinecap="round">
        {/* mast, boom, forestay */}
        <path d="M152 196 L152 22" />
        <path d="M152 176 L74 178" />
        <path d="M152 26 L252 192" strokeWidth="1.2" />
        {/* mainsail and jib */}
        <path d="M150 30 Q128 100 78 174 L150 172 Z" fill="#eef5f7" />
        <path d="M156 40 Q200 120 240 186 L160 184 Z" fill="#f7f2e6" />
        {/* hull, sheer and cabin */}
        <path d="M46 194 Q150 202 262 190 Q250 206 226 214 L78 214 Q56 208 46 194 Z" fill="#0f2a33" stroke="#0f2a33" />
        <path d="M108 194 L116 186 L176 186 L184 194" fill="#fdfbf6" />
        {/* keel and rudder */}
        <path d="M140 214 L146 236 L170 236 L172 214" fill="#0f2a33" stroke="#0f2a33" />
        <path d="M80 213 L74 230 L86 230 L90 214" fill="#0f2a33" stroke="#0f2a33" />
      </g>
      <g fill="none" stroke="#a9ccd6" strokeWidth="1.5" strokeLinecap="round">
        <path d="M8 214 Q22 208 36 214 T64 214" />
        <path d="M236 214 Q250 208 264 214 T292 214" />
        <path d="M30 228 Q44 222 58 228 T86 228" />
        <path d="M200 232 Q214 226 228 232 T256 232" />
      </g>
    </svg>
  );
}

export function SystemsChart({ rows }: { rows: { name: string; count: number }[] }) {
  const chart = layoutBarChart(rows.map((r) => ({ label: r.name, count: r.count })), { width: 420, labelWidth: 150, barHeight: 16, gap: 7, countWidth: 28 });
  const summary = rows.filter((r) => r.count > 0).map((r) => `${r.name}: ${r.count}`).join(", ") || "none";
  return (
    <svg className="dg-chart" viewBox={`0 0 ${chart.width} ${chart.height}`} role="img" aria-label={`Write-ups per system. ${summary}.`}>
      {chart.ticks.map((t) => (
        <g key={t.value} aria-hidden="true">
          <line x1={t.x} x2={t.x} y1={0} y2={chart.height - 16} stroke="#ece3cc" strokeWidth={1} />
          <text className="dg-chart-tick" x={t.x} y={chart.height - 3} textAnchor="middle">{t.value}</text>
        </g>
      ))}
      {chart.bars.map((b) => (
        <g key={b.label} aria-hidden="true">
          <text x={chart.plotX - 10} y={b.textY} textAnchor="end">{b.label}</text>
          <rect x={chart.plotX} y={b.y} width={Math.max(b.barWidth, b.count > 0 ? 2 : 0)} height={chart.barHeight} rx={2} fill={b.count > 0 ? "#1d4a58" : "#ece3cc"} />
          <text className="dg-chart-count" x={chart.plotX + b.barWidth + 6} y={b.textY}>{b.count}</text>
        </g>
      ))}
    </svg>
  );
}

function Entry({ entry, appUrl, photoSrc }: { entry: DigestEntry; appUrl: string; photoSrc: DigestDocumentProps["photoSrc"] }) {
  const src = entry.thumbnailKey ? photoSrc(entry.thumbnailKey) : null;
  const boat = entry.boatName && !entry.credit.includes(entry.boatName) ? entry.boatName : null;
  const hull = hullBesideCredit(entry.credit, entry.hullNumber) === null ? null : `hull ${entry.hullNumber}`;
  const url = new URL(`/writeups/${entry.slug}`, appUrl).toString();
  return (
    <article className={`dg-entry${src ? " dg-has-photo" : ""}`} data-writeup={entry.slug}>
      {src && <img className="dg-thumb" src={src} alt={entry.thumbnailAlt} />}
      <div>
        <h3><a href={url}>{entry.title}</a></h3>
        <p className="dg-byline">
          <strong>{entry.credit}</strong>{boat ? ` · ${boat}` : ""}{hull ? ` · ${hull}` : ""}
          {entry.publishedAt ? ` · published ${formatDigestDate(entry.publishedAt)}` : ""}
        </p>
        {entry.summary && <p className="dg-summary">{entry.summary}</p>}
        {entry.measurements.length > 0 && (
          <table className="dg-measures">
            <caption>Measured spaces (length x width x height)</caption>
            <tbody>
              {entry.measurements.map((m) => {
                const box = { length: m.lengthMm, width: m.widthMm, height: m.heightMm };
                return (
                  <tr key={m.space}>
                    <th scope="row">{m.space}</th>
                    <td>
                      {/* Unbreakable spaces keep each part on one line with a single element (the
                          tagged PDF makes a structure element of every element). */}
                      {keepTogether(formatDimensions(box, "in"))}{" "}
                      <span className="dg-dim-mm">
                        {keepTogether(`(${formatDimensions(box, "mm")})`)}{" "}
                        {keepTogether(`· ${m.measurements > 1 ? `consensus of ${m.measurements}` : m.measurements === 1 ? "1 measurement" : "as registered"}`)}
                      </span>
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        )}
        <p className="dg-entry-foot">
          {entry.systems.map((name) => <span key={name} className="dg-tag">{name}</span>)}
          {entry.doneToo > 0 && <span className="dg-done">Done on {plural(entry.doneToo, "other boat")} too</span>}
          {hostAndPath(appUrl, `/writeups/${entry.slug}`)}
        </p>
      </div>
    </article>
  );
}

export function DigestDocument({ snapshot, className, appUrl, photoSrc, draft = false, embedded = false }: DigestDocumentProps) {
  const CoverTitle = embedded ? "h2" : "h1";
  const f = snapshot.figures;
  const included = snapshot.sections.reduce((n, x) => n + x.entries.length, 0);
  const cautions = cautionsFor(snapshot.sections.map((x) => x.slug));
  const title = digestTitle(snapshot.year, snapshot.edition);
  return (
    <div className={included > DIGEST_LARGE_ENTRIES ? "dg dg-large" : "dg"}>
      <section className="dg-cover" aria-label="Cover">
        {draft && <p className="dg-draft-mark">Draft, not issued: what members will receive once the secretary issues it.</p>}
        <div className="dg-cover-band">
          <p className="dg-kicker">{className} owners' association</p>
        </div>
        <CoverTitle className="dg-cover-title">
          <span className="dg-title">The year's work</span>
          <span className="dg-year">{snapshot.year}</span>
        </CoverTitle>
        <p className="dg-cover-sub">
          {title}
          {snapshot.edition > 1 ? " (a correction)" : ""}
          {" · "}
          {snapshot.issuedAt ? `issued ${formatDigestDate(snapshot.issuedAt)}` : "not issued yet"}
          {" · "}
          {plural(included, "write-up")} by the owners of the class
        </p>
        {snapshot.correctionNote && (
          <p className="dg-correction"><strong>Correction.</strong> {snapshot.correctionNote}</p>
        )}
        <div className="dg-stats">
          <p className="dg-stat"><span className="dg-stat-value">{f.writeupsPublished}</span><span className="dg-stat-label">write-ups published</span></p>
          <p className="dg-stat"><span className="dg-stat-value">{f.spacesMeasured}</span><span className="dg-stat-label">spaces measured</span></p>
          <p className="dg-stat"><span className="dg-stat-value">{f.measurementsAdded}</span><span className="dg-stat-label">measurements added</span></p>
          <p className="dg-stat"><span className="dg-stat-value">{f.newMembers}</span><span className="dg-stat-label">new members</span></p>
        </div>
        <nav className="dg-contents" aria-label="In this digest">
          <h2>In this digest</h2>
          <ol>
            {snapshot.sections.map((section) => (
              <li key={section.slug} className="dg-toc-section">
                <span className="dg-toc-name">{section.name}</span>
                <ul>
                  {section.entries.map((e) => (
                    <li key={e.writeupId}>{e.title}<span>{e.credit}</span></li>
                  ))}
                </ul>
              </li>
            ))}
          </ol>
        </nav>
        <div className="dg-cover-art">
          <p>
            Compiled by the class secretary from the write-ups members published on Sistership, the {className} owners'
            knowledge base. What one owner measured or fixed applies, nearly to the inch, to every sistership.
          </p>
          <CoverSloop />
        </div>
      </section>

      {snapshot.letterHtml.trim() && (
        <section className="dg-letter" aria-labelledby="dg-letter-heading">
          <p className="dg-kicker">From the class secretary</p>
          <h2 id="dg-letter-heading">The editor's letter</h2>
          <div className="dg-letter-body" dangerouslySetInnerHTML={{ __html: snapshot.letterHtml }} />
        </section>
      )}

      <section className="dg-figures" aria-labelledby="dg-figures-heading">
        <p className="dg-kicker">{snapshot.year} in figures</p>
        <h2 id="dg-figures-heading">The class's year</h2>
        <div className="dg-figures-grid">
          <div>
            <h3>Write-ups per system</h3>
            <SystemsChart rows={f.perSystem} />
            <p className="dg-note">
              {plural(f.writeupsPublished, "write-up")} published in {snapshot.year}, {included} of them in this digest.
              A write-up tagged with two systems counts under each.
            </p>
          </div>
          <div>
            <h3>Done on the most boats</h3>
            {f.mostDoneToo.length > 0 ? (
              <ol className="dg-most">
                {f.mostDoneToo.map((m) => (
                  <li key={m.slug}><span>{m.title}</span><b>done on {plural(m.count, "other boat")}</b></li>
                ))}
              </ol>
            ) : (
              <p className="dg-note">No member has yet marked one of these write-ups as done on their boat too.</p>
            )}
            <p className="dg-note">
              Boats other than the author's whose owners marked the write-up "done on my boat too".
              Spaces and measurements count the measurements taken in {snapshot.year}; new members, the accounts opened in it.
            </p>
          </div>
        </div>
      </section>

      <div className="dg-writeups">
        {snapshot.sections.map((section) => (
          <section key={section.slug} className="dg-section" aria-labelledby={`dg-s-${section.slug || "other"}`}>
            <div className="dg-section-head">
              <h2 id={`dg-s-${section.slug || "other"}`}>{section.name}</h2>
              <span className="dg-count">{plural(section.entries.length, "write-up")}</span>
            </div>
            {section.entries.map((e) => <Entry key={e.writeupId} entry={e} appUrl={appUrl} photoSrc={photoSrc} />)}
          </section>
        ))}

        {cautions.length > 0 && (
          <aside className="dg-safety" aria-labelledby="dg-safety-heading">
            <h2 id="dg-safety-heading">Before you start work like this</h2>
            <ul>
              {cautions.map((c) => (
                <li key={c.key}><strong>{c.title}.</strong> {c.text}<span>Source: {c.source}</span></li>
              ))}
            </ul>
            <p className="dg-note">
              Each write-up is one owner's account, not professional advice. Follow the applicable standards and local
              codes, and ask a licensed professional where the work calls for one.
            </p>
          </aside>
        )}
        <p className="dg-colophon">
          {title} of the {className} owners' association, compiled from the write-ups members published on
          Sistership ({hostAndPath(appUrl, "/digest")}). Write-ups, credits and measurements are the members' own.
        </p>
      </div>
    </div>
  );
}
