import { hasRole, ROLES, type BoardDetail, type BoardModel } from '@splitscope/contract';
import { useState } from 'react';
import { useParams, useSearchParams } from 'react-router-dom';
import { BoardMap } from '@/components/board-map/board-map';
import { QueryState } from '@/components/ui/query-state';
import { useMe } from '@/lib/api/me';
import { METER_LABEL, meterText } from '@/lib/format';
import { useBoard } from '../api/get-board';
import { useUpdateBoard } from '../api/update-board';
import { imageSize } from '@/lib/image-size';
import { uploadPicture } from '../api/upload-picture';
import { ComposePanel } from './compose-panel';
import { FaultCodesPanel } from './fault-codes-panel';
import { ModelCorrection } from './model-correction';
import { ReferencesPanel } from './references-panel';

const input = 'min-h-11 rounded-md border border-stone-500 bg-white px-2';

function Editor({ board, save }: { board: BoardDetail; save: ReturnType<typeof useUpdateBoard> }) {
  const me = useMe();
  const [doc, setDoc] = useState<BoardModel>(board.document);
  const [pic, setPic] = useState<string | undefined>(board.pictureUrl ?? undefined);
  const [pictureError, setPictureError] = useState<string | null>(null);
  const [selected, setSelected] = useState<string | null>(null);
  const [placing, setPlacing] = useState<'point' | 'part'>('point');
  const [note, setNote] = useState('');
  const canEdit = hasRole(me.data?.role, ROLES.reviewers);

  const movePoint = (id: string, x: number, y: number) => setDoc({ ...doc, testPoints: doc.testPoints.map((t) => (t.id === id ? { ...t, x, y } : t)) });
  const place = (x: number, y: number) => {
    if (!selected) return;
    if (placing === 'point') movePoint(selected, x, y);
    else setDoc({ ...doc, parts: doc.parts.map((p) => (p.designator === selected ? { ...p, x, y } : p)) });
  };
  const setPointNet = (id: string, net: string) => setDoc({ ...doc, testPoints: doc.testPoints.map((t) => (t.id === id ? { ...t, net } : t)) });
  const setPartPinNet = (designator: string, pin: string, net: string) =>
    setDoc({ ...doc, parts: doc.parts.map((p) => (p.designator === designator ? { ...p, pins: p.pins.map((q) => (q.pin === pin ? { ...q, net } : q)) } : p)) });
  const addPoint = () => {
    const n = Math.max(0, ...doc.testPoints.map((t) => Number(t.id.slice(2)) || 0)) + 1;
    const net = doc.nets[0]?.name ?? '0';
    setDoc({
      ...doc,
      testPoints: [
        ...doc.testPoints,
        {
          id: `TP${n}`,
          label: 'new point',
          net,
          reference: '0',
          x: doc.picture.width / 2,
          y: doc.picture.height / 2,
          powerStates: ['on'],
          modes: ['dcv'],
          section: doc.sections[0]?.id ?? '',
          touchesBus: false,
        },
      ],
    });
    setSelected(`TP${n}`);
  };
  // A photo is stored as an upload first; the document only names it, so it stays small whatever the photo weighs.
  const upload = async (f: File | undefined) => {
    if (!f) return;
    setPictureError(null);
    try {
      const u = await uploadPicture(f);
      const size = await imageSize(u.url);
      setDoc({ ...doc, picture: { uploadId: u.id, width: size.width, height: size.height, units: 'px' } });
      setPic(u.url);
    } catch (err) {
      setPictureError(`The picture was not stored: ${(err as Error).message}`);
    }
  };
  const unit = doc.picture.width / 60;

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h1 className="text-2xl font-semibold">
          {board.name} · version {board.version}
        </h1>
        {canEdit && (
          <div className="flex flex-wrap items-end gap-2">
            <label>
              <span className="block text-sm font-medium">Note for this version</span>
              <input className={input} value={note} onChange={(e) => setNote(e.target.value)} />
            </label>
            <button
              type="button"
              className="min-h-11 rounded-md bg-board px-4 font-semibold text-white"
              disabled={save.isPending}
              onClick={() => save.mutate({ document: doc, note })}
            >
              {save.isPending ? 'Saving…' : 'Save as a new version'}
            </button>
          </div>
        )}
      </div>
      {save.error && (
        <p role="alert" className="text-high">
          {save.error.message}
        </p>
      )}
      {save.isSuccess && (
        <p role="status" className="text-ok">
          Saved: the expected-readings table below was recomputed by the server.
        </p>
      )}
      <div className="grid gap-3 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="space-y-2">
          <div className="h-[55vh] min-h-80">
            <BoardMap
              pictureUrl={pic}
              size={{ width: doc.picture.width, height: doc.picture.height }}
              points={doc.testPoints.map((t) => ({ id: t.id, label: t.id, x: t.x, y: t.y, net: t.net, state: 'unmeasured' }))}
              parts={doc.parts.map((p) => ({ id: p.designator, x: p.x - unit, y: p.y - unit * 0.6, width: unit * 2, height: unit * 1.2 }))}
              connectors={doc.connectors.map((c) => ({
                id: c.name,
                x: c.x,
                y: c.y,
                pins: c.pins.map((p, i) => ({ label: p.pin, net: p.net, x: c.x + i * unit * 1.4, y: c.y })),
              }))}
              selectedId={placing === 'point' ? selected : null}
              highlightPart={placing === 'part' ? selected : null}
              onSelect={(id) => {
                setPlacing('point');
                setSelected(id);
              }}
              onPointMove={canEdit ? movePoint : undefined}
              onBoardClick={canEdit ? place : undefined}
            />
          </div>
          <p className="text-sm text-stone-700">Drag a test point to move it, or pick a point or part in the lists and click the board to place it.</p>
          {canEdit && (
            <label className="block">
              <span className="text-sm font-medium">Board photo (PNG or JPEG)</span>
              <input type="file" accept="image/png,image/jpeg" className="mt-1 block min-h-11" onChange={(e) => void upload(e.target.files?.[0])} />
            </label>
          )}
          {pictureError && (
            <p role="alert" className="text-high">
              {pictureError}
            </p>
          )}
        </div>
        <div className="space-y-3">
          <section aria-labelledby="tp-h">
            <div className="flex items-center justify-between">
              <h2 id="tp-h" className="text-lg font-semibold">
                Test points
              </h2>
              {canEdit && (
                <button type="button" onClick={addPoint} className="min-h-11 rounded-md border border-stone-400 bg-white px-3 font-semibold">
                  Add a point
                </button>
              )}
            </div>
            <ul className="max-h-64 space-y-1 overflow-auto">
              {doc.testPoints.map((t) => (
                <li
                  key={t.id}
                  className={`flex flex-wrap items-center gap-2 rounded-md border p-1 ${selected === t.id && placing === 'point' ? 'border-copper bg-amber-50' : 'border-stone-300 bg-white'}`}
                >
                  <button
                    type="button"
                    className="min-h-11 min-w-16 font-semibold"
                    onClick={() => (setPlacing('point'), setSelected(t.id))}
                    aria-pressed={selected === t.id && placing === 'point'}
                  >
                    {t.id}
                  </button>
                  <label className="flex items-center gap-1 text-sm">
                    net
                    <select className={input} value={t.net} disabled={!canEdit} onChange={(e) => setPointNet(t.id, e.target.value)}>
                      {doc.nets.map((n) => (
                        <option key={n.name} value={n.name}>
                          {n.name}
                        </option>
                      ))}
                    </select>
                  </label>
                  <span className="text-xs tabular-nums text-stone-700">
                    {Math.round(t.x)}, {Math.round(t.y)}
                  </span>
                </li>
              ))}
            </ul>
          </section>
          <section aria-labelledby="parts-h">
            <h2 id="parts-h" className="text-lg font-semibold">
              Parts
            </h2>
            <ul className="max-h-64 space-y-1 overflow-auto">
              {doc.parts.map((p) => (
                <li
                  key={p.designator}
                  className={`rounded-md border p-1 ${selected === p.designator && placing === 'part' ? 'border-copper bg-amber-50' : 'border-stone-300 bg-white'}`}
                >
                  <button
                    type="button"
                    className="min-h-11 font-semibold"
                    onClick={() => (setPlacing('part'), setSelected(p.designator))}
                    aria-pressed={selected === p.designator && placing === 'part'}
                  >
                    {p.designator} <span className="font-normal">{p.value}</span>
                  </button>
                  <div className="flex flex-wrap gap-1">
                    {p.pins.map((q) => (
                      <label key={q.pin} className="flex items-center gap-1 text-xs">
                        pin {q.pin}
                        <select className={input} value={q.net} disabled={!canEdit} onChange={(e) => setPartPinNet(p.designator, q.pin, e.target.value)}>
                          {doc.nets.map((n) => (
                            <option key={n.name} value={n.name}>
                              {n.name}
                            </option>
                          ))}
                        </select>
                      </label>
                    ))}
                  </div>
                </li>
              ))}
            </ul>
          </section>
        </div>
      </div>
      {doc.composition && (
        <ComposePanel
          composition={doc.composition}
          canEdit={canEdit}
          onComposed={(d, drawing) => {
            // A photo stays the picture; without one the new drawing is shown (the server draws it again on save).
            setDoc({ ...d, id: doc.id, picture: doc.picture.uploadId ? doc.picture : d.picture });
            if (!doc.picture.uploadId) setPic(drawing);
          }}
        />
      )}
      <section aria-labelledby="netlist-h" className="space-y-1">
        <h2 id="netlist-h" className="text-lg font-semibold">
          Netlist (SPICE subset)
        </h2>
        <p className="text-sm text-stone-700">
          {doc.sections.length > 0
            ? `Composed from ${doc.sections.length} section templates: ${doc.sections.map((s) => s.title || s.template).join(', ')}. `
            : ''}
          Paste a netlist to replace it; the server checks it and recomputes the expected readings when you save.
        </p>
        <textarea
          aria-label="Netlist"
          value={doc.netlist}
          readOnly={!canEdit}
          onChange={(e) => setDoc({ ...doc, netlist: e.target.value })}
          rows={8}
          spellCheck={false}
          className="block w-full rounded-md border border-stone-500 bg-white p-2 font-mono text-sm"
        />
      </section>
      <FaultCodesPanel boardId={board.id} doc={board.document} canEdit={canEdit} />
      <ReferencesPanel board={board} canRecord={hasRole(me.data?.role, ROLES.bench)} />
      <section aria-labelledby="exp-h">
        <h2 id="exp-h" className="text-lg font-semibold">
          Expected readings (computed from the netlist)
        </h2>
        <div className="overflow-x-auto rounded-lg border border-stone-300 bg-white">
          <table className="w-full text-left text-sm">
            <thead className="bg-stone-100">
              <tr>
                <th className="p-1">Test</th>
                <th>Meter</th>
                <th>Power</th>
                <th>Red → black</th>
                <th>Expected</th>
                <th>Band</th>
                <th>Note</th>
              </tr>
            </thead>
            <tbody>
              {board.expectedReadings.map((r) => (
                <tr key={r.id} className="border-t border-stone-200">
                  <td className="p-1 font-semibold">{r.label ?? r.id}</td>
                  <td>{METER_LABEL[r.mode]}</td>
                  <td>{r.power}</td>
                  <td>
                    {r.red} → {r.black}
                  </td>
                  <td className="tabular-nums">{meterText(r.expected, r.unit)}</td>
                  <td className="tabular-nums">{r.low !== null && r.high !== null ? `${meterText(r.low, r.unit)} – ${meterText(r.high, r.unit)}` : '—'}</td>
                  <td className="max-w-md text-xs">{[r.note, r.source && `band: ${r.source}`].filter(Boolean).join(' · ')}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </section>
    </div>
  );
}

function BoardEditorPage() {
  const { id = '' } = useParams();
  // ?version=N opens an older version (a job's bench links to the version the job is pinned to).
  const version = Number(useSearchParams()[0].get('version')) || undefined;
  const board = useBoard(id, version);
  // Held here, not in the editor: a saved version remounts the editor, and the "saved" note must survive that.
  const save = useUpdateBoard(id);
  return (
    <QueryState query={board} label="the board model">
      {(b) =>
        b.modelProblem ? <ModelCorrection board={{ ...b, modelProblem: b.modelProblem }} /> : <Editor key={`${b.id}-${b.version}`} board={b} save={save} />
      }
    </QueryState>
  );
}

export default BoardEditorPage;
