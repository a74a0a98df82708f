import { lazy, Suspense, useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { Link, useNavigation, useParams, useSearchParams } from 'react-router';
import { useQueryClient } from '@tanstack/react-query';
import { Badge } from '../../../components/badge.tsx';
import { Button, ButtonLink, buttonClasses } from '../../../components/button.tsx';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { PageHeader } from '../../../components/page-header.tsx';
import { ProgressBar } from '../../../components/progress-bar.tsx';
import { paths } from '../../../config/paths.ts';
import { useUser } from '../../../lib/auth.ts';
import { formatDateTime } from '../../../lib/format.ts';
import { traceDownloads } from '../api/downloads.ts';
import { traceKeys } from '../../../lib/query-keys.ts';
import type { AnalysisEvent, AnalysisSummary, TraceItem } from '../../../../shared/api/index.ts';
import { useTraceContracts } from '../api/get-trace-contracts.ts';
import { useTraceFindings } from '../api/get-trace-findings.ts';
import { useTraceSummary } from '../api/get-trace-summary.ts';
import { useTraceTimeline } from '../api/get-trace-timeline.ts';
import type { PinnedFinding } from '../../../components/timeline/finding-pins.tsx';
import { watchAnalysis } from '../api/watch-analysis.ts';
import { CommentThread } from '../components/comment-thread.tsx';
import { CONTRACTS_PAGE_SIZE, ContractsTable } from '../components/contracts-table.tsx';
import { FINDINGS_PAGE_SIZE, FindingsTable } from '../components/findings-table.tsx';
import { ShareDialog } from '../components/share-dialog.tsx';
import { TraceMessages } from '../components/trace-messages.tsx';
import { FindingCounts } from '../components/traces-table.tsx';
import { timelineInput } from '../lib/timeline-input.ts';
import { windowFromParams, windowRead } from '../lib/first-window.ts';
import { loadTimelineChunk } from '../lib/timeline-chunk.ts';
import type { TimeWindow } from '../../../components/timeline/time-window.ts';
import { formatBytes } from '../lib/format.ts';
import { mayWriteTraces } from '../lib/roles.ts';
import { plural } from '../../../lib/plural.ts';

// The timeline arrives in its own chunk, asked for by the route as navigation starts (beside the
// summary and the first window: api/prefetch-trace-page.ts) rather than once they have arrived.
const TraceTimeline = lazy(async () => ({ default: (await loadTimelineChunk()).TraceTimeline }));

/**
 * Writes the window into the URL a moment after it settles (a brush drag is many windows). It writes
 * nothing while the router is on its way to another page (a lazy page keeps this one mounted until it
 * loads; a write then would cancel that navigation) or when the URL already holds this window.
 */
function useDebouncedWindow(setParams: ReturnType<typeof useSearchParams>[1], setView: (window: TimeWindow) => void) {
  const timer = useRef<ReturnType<typeof setTimeout> | undefined>(undefined);
  const navigation = useNavigation();
  const navigating = useRef(false);
  navigating.current = navigation.state !== 'idle';
  useEffect(() => () => clearTimeout(timer.current), []);
  return useCallback(
    (next: TimeWindow) => {
      clearTimeout(timer.current);
      timer.current = setTimeout(() => {
        if (navigating.current) return;
        setView(next);
        const inUrl = new URLSearchParams(window.location.search);
        if (inUrl.get('from') === String(Math.round(next.startUs)) && inUrl.get('to') === String(Math.round(next.endUs))) return;
        setParams(
          (current) => {
            const params = new URLSearchParams(current);
            params.set('from', String(Math.round(next.startUs)));
            params.set('to', String(Math.round(next.endUs)));
            return params;
          },
          { replace: true, preventScrollReset: true },
        );
      }, 300);
    },
    [setParams, setView],
  );
}

export function TraceRoute() {
  const { traceId = '' } = useParams();
  const trace = useTraceSummary(traceId);
  // The first window is read beside the summary (the page asks for the same one once the summary is in).
  const [params] = useSearchParams();
  const [firstRead] = useState(() => windowRead(windowFromParams(params)));
  useTraceTimeline(traceId, firstRead);
  useEffect(() => void loadTimelineChunk(), []);
  // Arriving from a scrolled list, start at the top of the trace.
  // biome-ignore lint/correctness/useExhaustiveDependencies: each new trace id is the trigger
  useEffect(() => {
    window.scrollTo(0, 0);
  }, [traceId]);
  if (trace.isError) return <ErrorMessage title="The trace could not be loaded" error={trace.error} action={<ButtonLink to={paths.traces.index.getHref()}>All traces</ButtonLink>} />;
  if (!trace.data) return <p className="text-xs text-slate-500">Loading the trace…</p>;
  return <TracePage item={trace.data.trace} analysis={trace.data.analysis} />;
}

function AnalysisProgress({ item }: { item: TraceItem }) {
  const queryClient = useQueryClient();
  const [event, setEvent] = useState<AnalysisEvent | null>(null);
  useEffect(
    () =>
      watchAnalysis(item.id, (next) => {
        setEvent(next);
        if (next.type !== 'progress') void queryClient.invalidateQueries({ queryKey: traceKeys.detail(item.id) });
      }),
    [item.id, queryClient],
  );
  const fraction = event?.type === 'progress' && event.totalBytes > 0 ? event.bytesRead / event.totalBytes : undefined;
  return (
    <Card>
      <CardBody className="space-y-2">
        <p className="text-sm text-slate-700 dark:text-slate-300">Analysing {formatBytes(item.sizeBytes)} on the server…</p>
        <ProgressBar label="Analysis" fraction={fraction} />
      </CardBody>
    </Card>
  );
}

const NO_PINS: PinnedFinding[] = [];

function TracePage({ item, analysis }: { item: TraceItem; analysis: AnalysisSummary | null }) {
  const user = useUser();
  const [params, setParams] = useSearchParams();
  const [shareOpen, setShareOpen] = useState(false);
  const selected = params.get('finding') === null ? undefined : Number(params.get('finding'));
  const [focus, setFocus] = useState<{ tUs: number; key: number; walk?: boolean } | null>(null);
  // The message chosen in the list (its index in the whole trace) and an arrow clicked on the lanes for the list to find.
  const [chosenMessage, setChosenMessage] = useState<number | undefined>(undefined);
  const [follow, setFollow] = useState<{ tUs: number; key: number } | null>(null);
  const canWrite = mayWriteTraces(user.role);
  const done = item.status === 'done' && analysis !== null;
  const endUs = analysis?.endUs ?? 1;
  // Every VBUS reading of the trace (the window on screen holds only some of them).
  const readings = analysis ? analysis.timeline.measurements + analysis.timeline.omitted.measurements : 0;
  // The zoom is in the URL (?from=&to=, µs), so a copied link opens the same moment.
  const [initialWindow] = useState(() => windowFromParams(params));
  // What the page reads: the window on screen (the server answers only for it), a page of each table.
  const [view, setView] = useState<TimeWindow | null>(initialWindow);
  const saveWindow = useDebouncedWindow(setParams, setView);
  const timeline = useTraceTimeline(item.id, windowRead(view), done);
  const [findingsPage, setFindingsPage] = useState(() => (selected === undefined ? 0 : Math.floor(selected / FINDINGS_PAGE_SIZE)));
  const findings = useTraceFindings(item.id, { page: findingsPage + 1, pageSize: FINDINGS_PAGE_SIZE }, done);
  const [contractsPage, setContractsPage] = useState(0);
  const contracts = useTraceContracts(item.id, { page: contractsPage + 1, pageSize: CONTRACTS_PAGE_SIZE }, done);
  const contractsTotal = contracts.data?.total ?? 0;
  const hasNextContracts = (contractsPage + 1) * CONTRACTS_PAGE_SIZE < contractsTotal;
  // The next page's first contract ends this page's last; asking for it early also makes "next" instant.
  const nextContracts = useTraceContracts(item.id, { page: contractsPage + 2, pageSize: CONTRACTS_PAGE_SIZE }, done && hasNextContracts);
  const input = useMemo(() => (analysis && timeline.data ? timelineInput(analysis, timeline.data) : null), [analysis, timeline.data]);
  const pinsRead = timeline.data?.findings;
  const pins = useMemo<PinnedFinding[]>(() => (pinsRead ? pinsRead.map((pin) => ({ t: pin.t, severity: pin.severity, rule: pin.rule })) : NO_PINS), [pinsRead]);
  const selectedPin = selected === undefined || !pinsRead ? undefined : pinsRead.findIndex((pin) => pin.index === selected);
  const windowMessages = timeline.data?.messages;
  const chosenPlace = chosenMessage === undefined || !windowMessages ? undefined : windowMessages.findIndex((m) => m.index === chosenMessage);
  const chooseMessage = useCallback((index: number, message: { t: number }) => {
    setChosenMessage(index);
    setFocus({ tUs: message.t, key: Date.now(), walk: true });
  }, []);
  const followLane = useCallback(
    (place: number) => {
      const m = windowMessages?.[place];
      if (!m) return;
      setChosenMessage(m.index);
      setFollow({ tUs: m.t, key: Date.now() });
    },
    [windowMessages],
  );
  const messageAside = useCallback(
    ({ foldGoodCrc }: { foldGoodCrc: boolean }) => <TraceMessages traceId={item.id} fold={foldGoodCrc} onSelect={chooseMessage} follow={follow} />,
    [item.id, chooseMessage, follow],
  );

  const show = useCallback(
    (index: number, tUs: number | undefined) => {
      setParams(
        (current) => {
          const next = new URLSearchParams(current);
          next.set('finding', String(index));
          return next;
        },
        { replace: true },
      );
      setFindingsPage(Math.floor(index / FINDINGS_PAGE_SIZE));
      if (tUs === undefined) return;
      // The chart goes to the finding and the message list to its row (the first message at that time).
      const key = Date.now();
      setFocus({ tUs, key });
      setFollow({ tUs, key });
    },
    [setParams],
  );
  const showPin = useCallback(
    (place: number) => {
      const pin = pinsRead?.[place];
      if (pin) show(pin.index, pin.t);
    },
    [pinsRead, show],
  );

  // A link with ?finding= opens the timeline at that finding, once, when its page of findings arrives.
  const arrived = useRef(false);
  useEffect(() => {
    if (arrived.current || !findings.data) return;
    arrived.current = true;
    const t = selected === undefined ? undefined : findings.data.items.find((f) => f.index === selected)?.t;
    if (t === undefined) return;
    setFocus({ tUs: t, key: 0 });
    setFollow({ tUs: t, key: 0 });
  }, [findings.data, selected]);

  const meta = [
    item.device?.name,
    item.customerRef ? `customer ${item.customerRef}` : '',
    `${item.fileName} (${formatBytes(item.sizeBytes)}, ${item.format})`,
    `uploaded by ${item.uploader.name} ${formatDateTime(item.createdAt)}`,
  ].filter(Boolean);

  const actions = (
    <div className="flex flex-wrap gap-2" data-testid="trace-actions">
      {canWrite && done && (
        <Button size="sm" onClick={() => setShareOpen(true)}>
          Share diagnosis
        </Button>
      )}
      {done && (
        <>
          <a className={buttonClasses('secondary', 'sm')} href={traceDownloads.report(item.id)} download>
            Export JSON
          </a>
          <Link className={buttonClasses('secondary', 'sm')} to={paths.traces.report.getHref(item.id)} target="_blank">
            Printable report
          </Link>
          <a className={buttonClasses('secondary', 'sm')} href={traceDownloads.vector(item.id)} download>
            Download as vector
          </a>
        </>
      )}
      <a className={buttonClasses('ghost', 'sm')} href={traceDownloads.original(item.id)} download>
        Original file
      </a>
    </div>
  );

  return (
    <>
      <PageHeader eyebrow="Trace" title={item.title} documentTitle={`Trace ${item.id} — ${item.title}`} description={meta.join(' · ')} actions={actions} />
      <div className="space-y-6">
        {(item.status === 'queued' || item.status === 'analysing') && <AnalysisProgress item={item} />}
        {item.status === 'failed' && <ErrorMessage title="The analysis failed">{item.error?.message}</ErrorMessage>}
        {done && (
          <Card>
            <CardBody className="flex flex-wrap items-start justify-between gap-3">
              <p className="max-w-4xl text-base leading-relaxed text-slate-900 dark:text-slate-50" data-testid="trace-summary">
                {analysis.summary}
              </p>
              <FindingCounts item={item} />
            </CardBody>
            {item.notes && (
              <p className="border-t border-slate-200 px-5 py-3 text-sm whitespace-pre-wrap text-slate-600 dark:border-slate-800 dark:text-slate-400">
                <span className="font-medium text-slate-800 dark:text-slate-200">Notes: </span>
                {item.notes}
              </p>
            )}
          </Card>
        )}
        {done && input && analysis && (
          <Card>
            <CardHeader
              title="Timeline"
              description={`${plural(analysis.messages, 'message')}${readings > 0 ? `, ${plural(readings, 'VBUS reading')}` : ''}. Drag the brush under the chart to zoom; click a finding to jump to it.`}
              actions={
                <Link className={buttonClasses('ghost', 'sm')} to={paths.bench.getHref({ fromTrace: item.id })}>
                  Replay on the Bench
                </Link>
              }
            />
            <CardBody>
              <Suspense fallback={<p className="h-80 text-xs text-slate-500">Loading the chart…</p>}>
                <TraceTimeline
                  measurements={input.measurements}
                  messages={input.messages}
                  findings={pins}
                  events={input.events}
                  initialWindow={initialWindow}
                  onWindowChange={saveWindow}
                  contracts={input.contracts}
                  bands={input.bands}
                  endUs={input.endUs}
                  focus={focus}
                  selectedFinding={selectedPin === -1 ? undefined : selectedPin}
                  onSelectFinding={showPin}
                  messageAside={messageAside}
                  selectedMessage={chosenPlace === -1 ? undefined : chosenPlace}
                  onSelectMessage={followLane}
                />
              </Suspense>
              {input.omitted && <p className="mt-2 text-xs text-slate-500">{input.omitted}</p>}
            </CardBody>
          </Card>
        )}
        {done && (
          <div className="grid items-start gap-6 xl:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
            <Card>
              <CardHeader title="Findings" description="Click a time to see it on the timeline; click a rule to read what it means." actions={<Badge mono>{analysis.findingsListed}</Badge>} />
              <CardBody>
                <FindingsTable
                  rows={findings.data?.items ?? []}
                  total={findings.data?.total ?? 0}
                  pageIndex={findingsPage}
                  onPageChange={setFindingsPage}
                  selectedIndex={selected}
                  onShow={show}
                  omitted={analysis.findingsOmitted}
                />
              </CardBody>
            </Card>
            <Card>
              <CardHeader title="Contracts over time" />
              <CardBody>
                <ContractsTable rows={contracts.data?.items ?? []} nextUs={nextContracts.data?.items[0]?.t ?? endUs} total={contractsTotal} pageIndex={contractsPage} onPageChange={setContractsPage} />
              </CardBody>
            </Card>
          </div>
        )}
        <Card>
          <CardHeader title="Comments" />
          <CardBody>
            <CommentThread traceId={item.id} canWrite={canWrite} />
          </CardBody>
        </Card>
      </div>
      {canWrite && done && <ShareDialog traceId={item.id} open={shareOpen} onClose={() => setShareOpen(false)} />}
    </>
  );
}
