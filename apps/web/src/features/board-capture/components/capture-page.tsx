import { canPublishBoards, type BoardCapture, type BoardDraft, type CaptureSection } from '@splitscope/contract';
import { TEMPLATE_INFO } from '@splitscope/boards';
import { useEffect, useRef, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Button } from '@/components/ui/button';
import { Caution } from '@/components/ui/caution';
import { QueryState } from '@/components/ui/query-state';
import { useMe } from '@/lib/api/me';
import { useDraft } from '@/lib/api/get-draft';
import { usePublishDraft, useSaveDraft } from '../api/draft';
import { CaptureStage, type Tool } from './capture-stage';
import { ConnectorList, PointList } from './capture-lists';
import { SectionForm } from './section-form';

const TOOLS: { id: Tool; label: string }[] = [
  { id: 'point', label: 'Place test point' },
  { id: 'connector', label: 'Place connector' },
  { id: 'section', label: 'Mark section (drag)' },
  { id: 'look', label: 'Look only' },
];

const nextNumber = (ids: string[], prefix: string) => Math.max(0, ...ids.map((i) => Number(i.slice(prefix.length)) || 0)) + 1;

/** Width the stage gets: the column it sits in. */
function useWidth() {
  const ref = useRef<HTMLDivElement>(null);
  const [w, setW] = useState(600);
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const ro = new ResizeObserver(() => setW(el.clientWidth));
    ro.observe(el);
    setW(el.clientWidth);
    return () => ro.disconnect();
  }, []);
  return [ref, w] as const;
}

function Capture({ boardId, draft }: { boardId: string; draft: BoardDraft }) {
  const me = useMe();
  const [capture, setCapture] = useState<BoardCapture>(draft.capture);
  const [tool, setTool] = useState<Tool>('point');
  const [template, setTemplate] = useState<CaptureSection['template']>('dc-bus');
  const [selected, setSelected] = useState<string | null>(null);
  const [showNetlist, setShowNetlist] = useState(false);
  const [note, setNote] = useState('');
  const [ref, width] = useWidth();
  const save = useSaveDraft(boardId);
  const publish = usePublishDraft(boardId);
  const saved = save.data ?? draft;
  // The server's copy of the capture (defaults filled in) is the one compared against, so a saved draft is not "changed".
  const dirty = JSON.stringify(capture) !== JSON.stringify(saved.capture);
  // Marking needs a pointer and room; on a phone the draft is shown, not edited.
  const narrow = width < 560;

  const place = (kind: 'point' | 'connector', x: number, y: number) => {
    if (kind === 'point') {
      const id = `TP${nextNumber(
        capture.points.map((p) => p.id),
        'TP',
      )}`;
      setCapture({ ...capture, points: [...capture.points, { id, label: '', x, y }] });
      setSelected(id);
    } else {
      const name = `CN${nextNumber(
        capture.connectors.map((c) => c.name),
        'CN',
      )}`;
      setCapture({ ...capture, connectors: [...capture.connectors, { name, x, y, pins: [{ pin: '1', net: '', function: '' }] }] });
      setSelected(name);
    }
  };
  const region = (r: { x: number; y: number; w: number; h: number }) => {
    const base = Math.max(0, ...capture.sections.map((s) => s.base)) + 100;
    const info = TEMPLATE_INFO.find((t) => t.template === template)!;
    const id = capture.sections.some((s) => s.id === info.sectionId) ? `${info.sectionId}-${base}` : info.sectionId;
    const title = info.title;
    setCapture({ ...capture, sections: [...capture.sections, { id, template, title, base, region: r, nets: {}, params: {}, values: {}, markings: {} }] });
    setSelected(id);
  };
  const setSection = (i: number, s: CaptureSection) => setCapture({ ...capture, sections: capture.sections.map((x, j) => (j === i ? s : x)) });

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center gap-2">
        <h1 className="text-xl font-semibold">Mark the board on its photo</h1>
        <Link className="text-sm underline" to={`/boards/${boardId}`}>
          Board model
        </Link>
      </div>
      <Caution title="Mains and the DC bus" tone="warn">
        Photograph and mark the board unplugged. The ~300 V bus and its bulk capacitor can kill; discharge and measure the bus before any unpowered test, and
        follow local codes and licensed practice.
      </Caution>
      <p className="text-sm text-stone-800" role="status">
        {saved.publishedModel
          ? 'This board has a published model; publishing this draft makes its next version.'
          : 'No model for this board yet: readings are recorded, not judged. Mark its sections and publish to have readings judged.'}
      </p>
      {narrow && (
        <p className="rounded-md bg-amber-100 p-2 text-sm">Marking a board needs a wider screen. Here you can look at the draft and its computed values.</p>
      )}
      {!narrow && (
        <div className="flex flex-wrap items-end gap-2" role="toolbar" aria-label="Marking tools">
          {TOOLS.map((t) => (
            <button
              key={t.id}
              type="button"
              aria-pressed={tool === t.id}
              onClick={() => setTool(t.id)}
              className={`min-h-11 rounded-md border px-3 text-sm ${tool === t.id ? 'border-teal-800 bg-teal-800 text-white' : 'border-stone-500 bg-white'}`}
            >
              {t.label}
            </button>
          ))}
          <label className="flex flex-col text-sm">
            Section template
            <select
              className="min-h-11 rounded-md border border-stone-500 bg-white px-2"
              value={template}
              onChange={(e) => setTemplate(e.target.value as CaptureSection['template'])}
            >
              {TEMPLATE_INFO.map((t) => (
                <option key={t.template} value={t.template}>
                  {t.title}
                </option>
              ))}
            </select>
          </label>
        </div>
      )}
      <div className="grid gap-3 lg:grid-cols-[minmax(0,3fr)_minmax(20rem,2fr)]">
        <div ref={ref} className="min-w-0" data-testid="capture-photo">
          <CaptureStage
            capture={capture}
            draft={dirty ? undefined : saved}
            tool={narrow ? 'look' : tool}
            width={width}
            onPlace={place}
            onRegion={region}
            selected={selected}
          />
        </div>
        <div className="space-y-3">
          <PointList capture={capture} draft={dirty ? undefined : saved} nets={saved.nets} readOnly={narrow} onChange={setCapture} />
          <section aria-labelledby="sections-h" className="space-y-2">
            <h2 id="sections-h" className="text-lg font-semibold">
              Sections ({capture.sections.length})
            </h2>
            {capture.sections.length === 0 && <p className="text-sm">Choose a template and drag a box around that part of the board.</p>}
            {!narrow &&
              capture.sections.map((s, i) => (
                <SectionForm
                  key={s.id}
                  section={s}
                  onChange={(n) => setSection(i, n)}
                  onRemove={() => setCapture({ ...capture, sections: capture.sections.filter((_, j) => j !== i) })}
                />
              ))}
          </section>
          <ConnectorList capture={capture} readOnly={narrow} onChange={setCapture} />
        </div>
      </div>
      {!narrow && (
        <div className="flex flex-wrap items-end gap-2 border-t border-stone-300 pt-3">
          <Button type="button" disabled={save.isPending} onClick={() => save.mutate(capture, { onSuccess: (d) => setCapture(d.capture) })}>
            {save.isPending ? 'Computing…' : 'Save draft'}
          </Button>
          {canPublishBoards(me.data?.role) && (
            <>
              <label className="flex flex-col text-sm">
                Version note
                <input className="min-h-11 rounded-md border border-stone-500 px-2" value={note} onChange={(e) => setNote(e.target.value)} />
              </label>
              <Button type="button" variant="secondary" disabled={dirty || publish.isPending || !saved.netlist} onClick={() => publish.mutate(note)}>
                Publish as a new version
              </Button>
            </>
          )}
          <span role="status" className="text-sm">
            {dirty ? (
              'Changes not saved yet.'
            ) : saved.problem ? (
              <span className="text-red-800">{saved.problem}</span>
            ) : saved.netlist ? (
              `Draft saved ${new Date(saved.savedAt).toLocaleTimeString()}: expected values computed.`
            ) : (
              ''
            )}
            {save.error ? <span className="text-red-800"> {save.error.message}</span> : null}
            {publish.data ? (
              ` Published as version ${publish.data.version}.`
            ) : publish.error ? (
              <span className="text-red-800"> {publish.error.message}</span>
            ) : null}
          </span>
        </div>
      )}
      <div>
        <button type="button" className="text-sm underline" aria-expanded={showNetlist} onClick={() => setShowNetlist(!showNetlist)}>
          {showNetlist ? 'Hide the netlist' : 'Show the netlist (advanced)'}
        </button>
        {showNetlist && (
          <pre className="mt-2 max-h-96 overflow-auto rounded-md bg-stone-100 p-2 text-xs">{saved.netlist ?? 'No sections yet: nothing to simulate.'}</pre>
        )}
      </div>
    </div>
  );
}

function CapturePage() {
  const { id = '' } = useParams();
  const draft = useDraft(id);
  return (
    <QueryState query={draft} label="the board's draft">
      {(d) => <Capture boardId={id} draft={d} />}
    </QueryState>
  );
}

export default CapturePage;
