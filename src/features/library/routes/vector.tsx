import { roleGroups, type Role } from '../../../lib/roles.ts';
import { useMemo, useState } from 'react';
import { useNavigate, useParams } from 'react-router';
import { Button, ButtonLink } from '../../../components/button.tsx';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { CodeEditor } from '../../../components/code-editor.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { Input } from '../../../components/input.tsx';
import { PageHeader } from '../../../components/page-header.tsx';
import { paths } from '../../../config/paths.ts';
import { isApiError } from '../../../lib/api-client.ts';
import { useUser } from '../../../lib/auth.ts';
import { cn } from '../../../lib/cn.ts';
import { formatDateTime } from '../../../lib/format.ts';
import { vectorJsonSchema } from '../../../../shared/vectors/schema.ts';
import { useDevices } from '../../../lib/api/get-devices.ts';
import { useVector } from '../api/get-vector.ts';
import { useSaveVector } from '../api/save-vector.ts';
import { useRunOne } from '../api/start-run.ts';
import type { StaleDetails, StoredVector } from '../../../../shared/api/index.ts';
import { fileOf } from '../api/types.ts';
import { HistoryPanel } from '../components/history-panel.tsx';
import { MergeView } from '../components/merge-view.tsx';
import { RunResultView } from '../components/run-result-view.tsx';
import { VectorForm } from '../components/vector-form.tsx';
import { parseText, setIn, templateFor, toText } from '../lib/vector-model.ts';

const writers: readonly Role[] = roleGroups.editors;

export function NewVectorRoute() {
  return <VectorEditor vectorId={null} />;
}

export function VectorRoute() {
  const params = useParams();
  const raw = params['*'] ?? '';
  let vectorId = raw;
  try {
    vectorId = decodeURIComponent(raw);
  } catch {
    vectorId = raw;
  }
  // A new key per vector: nothing of one vector's draft leaks into the next.
  return <VectorEditor key={vectorId} vectorId={vectorId} />;
}

function VectorEditor({ vectorId }: { vectorId: string | null }) {
  const user = useUser();
  const canWrite = writers.includes(user.role);
  const query = useVector(vectorId);
  if (vectorId !== null && query.isPending)
    return (
      <p className="text-sm text-slate-500" role="status">
        Loading the vector…
      </p>
    );
  if (vectorId !== null && query.isError) {
    return (
      <>
        <PageHeader eyebrow="Library" title={vectorId} />
        <ErrorMessage title="The vector could not be loaded" error={query.error} action={<ButtonLink to={paths.library.index.getHref()}>Back to the library</ButtonLink>} />
      </>
    );
  }
  return <EditorBody stored={query.data ?? null} canWrite={canWrite} />;
}

type Tab = 'edit' | 'history';

function EditorBody({ stored, canWrite }: { stored: StoredVector | null; canWrite: boolean }) {
  const navigate = useNavigate();
  const schema = useMemo(() => vectorJsonSchema(), []);
  const devices = useDevices();
  const save = useSaveVector();
  const runOne = useRunOne();
  const initialText = stored ? toText(fileOf(stored)) : toText(templateFor('caps'));
  const [savedText, setSavedText] = useState(stored ? initialText : '');
  const [text, setText] = useState(initialText);
  const [baseRevision, setBaseRevision] = useState<number | undefined>(stored?.revision);
  const [deviceId, setDeviceId] = useState<number | null>(stored?.deviceId ?? null);
  const [savedDeviceId, setSavedDeviceId] = useState<number | null>(stored?.deviceId ?? null);
  const [message, setMessage] = useState('');
  const [conflict, setConflict] = useState<StaleDetails | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const [tab, setTab] = useState<Tab>('edit');
  const parsed = parseText(text);
  const dirty = text !== savedText || deviceId !== savedDeviceId;
  const isNew = baseRevision === undefined;
  const id = parsed.ok && typeof parsed.value.id === 'string' ? parsed.value.id : (stored?.id ?? '');

  const doSave = (fileText: string, revision: number | undefined) => {
    const file = parseText(fileText);
    if (!file.ok) return;
    setNotice(null);
    save.mutate(
      { file: file.value, deviceId, message: message.trim() || (revision === undefined ? 'Created' : ''), revision },
      {
        onSuccess: (saved) => {
          const savedFileText = toText(fileOf(saved));
          setText(savedFileText);
          setSavedText(savedFileText);
          setBaseRevision(saved.revision);
          setSavedDeviceId(saved.deviceId);
          setMessage('');
          setConflict(null);
          setNotice(`Saved revision ${saved.revision}.`);
          if (revision === undefined) navigate(paths.library.vector.getHref(saved.id), { replace: true });
        },
        onError: (error) => {
          if (isApiError(error) && error.status === 409 && error.code === 'vector.stale') setConflict(error.details as StaleDetails);
        },
      },
    );
  };

  const tabClass = (active: boolean) =>
    cn(
      'rounded-md px-3 py-1.5 text-sm font-medium',
      active ? 'bg-slate-900 text-white dark:bg-slate-100 dark:text-slate-900' : 'text-slate-600 hover:bg-slate-200/70 dark:text-slate-300 dark:hover:bg-slate-800',
    );
  const saveError = save.isError && !(isApiError(save.error) && save.error.code === 'vector.stale') ? save.error : null;

  return (
    <>
      <PageHeader
        eyebrow="Library"
        title={isNew ? 'New vector' : id}
        documentTitle={isNew ? 'New vector' : `Vector ${id}${typeof stored?.title === 'string' ? ` — ${stored.title}` : ''}`}
        description={
          stored && !isNew ? (
            <>
              Revision {baseRevision} · written by {stored.meta.author.name} · last saved by {stored.meta.updatedBy.name} {formatDateTime(stored.meta.updatedAt)}
            </>
          ) : (
            'Fill in the form or write the file; both stay in step.'
          )
        }
        actions={<ButtonLink to={paths.library.index.getHref()}>Library</ButtonLink>}
      />
      {!isNew && (
        <div role="tablist" aria-label="Vector" className="mb-4 flex gap-1">
          <button type="button" role="tab" aria-selected={tab === 'edit'} className={tabClass(tab === 'edit')} onClick={() => setTab('edit')}>
            Edit
          </button>
          <button type="button" role="tab" aria-selected={tab === 'history'} className={tabClass(tab === 'history')} onClick={() => setTab('history')}>
            History
          </button>
        </div>
      )}
      {conflict && (
        <div className="mb-6">
          <MergeView
            mine={text}
            theirs={conflict}
            schema={schema}
            onCancel={() => setConflict(null)}
            onResolve={(choice) => {
              setText(choice.text);
              setBaseRevision(choice.baseRevision);
              setSavedText(conflict.text);
              setConflict(null);
              if (choice.save) doSave(choice.text, choice.baseRevision);
              else setNotice(`Their revision ${choice.baseRevision} is loaded; your change is gone.`);
            }}
          />
        </div>
      )}
      {tab === 'history' && stored && !isNew ? (
        <Card>
          <CardHeader title="History" description="Every save is a revision; restoring one saves it again as the newest." />
          <CardBody>
            <HistoryPanel
              vectorId={id}
              canWrite={canWrite}
              onRestored={() => {
                setTab('edit');
                setNotice('Restored as a new revision.');
              }}
            />
          </CardBody>
        </Card>
      ) : (
        <div className="flex flex-col gap-6">
          <div className="grid items-start gap-6 xl:grid-cols-2">
            <Card>
              <CardHeader title="Form" description="One field per part of the file." />
              <CardBody>
                {parsed.ok ? (
                  <VectorForm
                    value={parsed.value}
                    onChange={(next) => setText(toText(next))}
                    isNew={isNew}
                    devices={devices.data?.items ?? []}
                    deviceId={deviceId}
                    onDeviceChange={setDeviceId}
                    disabled={!canWrite}
                    setIn={setIn}
                  />
                ) : (
                  <p role="alert" className="text-sm text-orange-700 dark:text-orange-300">
                    {parsed.error.message} Fix the file on the right to use the form again.
                  </p>
                )}
              </CardBody>
            </Card>
            <Card>
              <CardHeader title="File" description="The vector file exactly as it is saved and exported." />
              <CardBody>
                <CodeEditor language="json" label="Vector JSON" path="vector.json" jsonSchema={schema} readOnly={!canWrite} height="36rem" value={text} onChange={setText} />
              </CardBody>
            </Card>
          </div>
          {canWrite && (
            <Card>
              <CardBody className="flex flex-wrap items-end gap-3">
                <Input
                  label="Revision message"
                  className="min-w-64 flex-1"
                  placeholder={isNew ? 'Created' : 'What changed and why'}
                  value={message}
                  onChange={(event) => setMessage(event.target.value)}
                  maxLength={500}
                />
                <Button onClick={() => doSave(text, baseRevision)} disabled={!parsed.ok || (!dirty && !isNew)} loading={save.isPending}>
                  {isNew ? 'Create vector' : `Save revision ${(baseRevision ?? 0) + 1}`}
                </Button>
                {!isNew && (
                  <Button variant="secondary" onClick={() => runOne.mutate(id)} loading={runOne.isPending} title={dirty ? 'Runs the saved revision, not your unsaved change' : undefined}>
                    Run this vector
                  </Button>
                )}
                {notice && (
                  <p role="status" className="text-sm text-emerald-700 dark:text-emerald-300">
                    {notice}
                  </p>
                )}
                {dirty && !isNew && <p className="text-xs text-slate-500">Unsaved changes</p>}
              </CardBody>
              {saveError && (
                <CardBody className="pt-0">
                  <ErrorMessage title="Not saved" error={saveError} />
                </CardBody>
              )}
            </Card>
          )}
          {(runOne.data || runOne.isError) && (
            <Card>
              <CardHeader
                title="Result of this vector"
                description={runOne.data ? `Run #${runOne.data.run.id} of revision ${baseRevision}` : undefined}
                actions={
                  runOne.data && (
                    <ButtonLink size="sm" to={paths.runs.detail.getHref(runOne.data.run.id)}>
                      Open the run
                    </ButtonLink>
                  )
                }
              />
              <CardBody>
                {runOne.isError && <ErrorMessage title="The vector did not run" error={runOne.error} />}
                {runOne.data?.results[0] && <RunResultView result={runOne.data.results[0]} />}
              </CardBody>
            </Card>
          )}
        </div>
      )}
    </>
  );
}
