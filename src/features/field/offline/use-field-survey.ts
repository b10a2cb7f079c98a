import { useCallback, useEffect, useRef, useState } from 'react';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import type { FieldState } from '@shared/schemas/field';
import { surveyKeys } from '@/lib/query-keys';
import { fieldStateQueryOptions } from '../api/get-field-state';
import { enqueue, loadSnapshot, outboxItems, removeItem, saveSnapshot, type OfflineSnapshot, type OutboxItem } from './field-db';
import { retryDelayMs, syncOutbox } from './sync';

/** navigator.onLine, kept current. */
export function useOnline(): boolean {
  const [online, setOnline] = useState(() => (typeof navigator === 'undefined' ? true : navigator.onLine));
  useEffect(() => {
    const on = () => setOnline(true);
    const off = () => setOnline(false);
    window.addEventListener('online', on);
    window.addEventListener('offline', off);
    return () => { window.removeEventListener('online', on); window.removeEventListener('offline', off); };
  }, []);
  return online;
}

/**
 * One survey in the field: the server's state when reachable, else the copy taken offline; the
 * phone's outbox (waiting and refused records); actions that queue first and sync when online.
 */
export function useFieldSurvey(surveyId: number) {
  const online = useOnline();
  const qc = useQueryClient();
  const server = useQuery(fieldStateQueryOptions(surveyId));
  const [snapshot, setSnapshot] = useState<OfflineSnapshot | null | undefined>(undefined);
  const [outbox, setOutbox] = useState<OutboxItem[]>([]);
  const [syncing, setSyncing] = useState(false);
  const [takingOffline, setTakingOffline] = useState(false);

  const refreshOutbox = useCallback(async () => setOutbox(await outboxItems(surveyId)), [surveyId]);

  useEffect(() => {
    let live = true;
    void loadSnapshot(surveyId).then((s) => { if (live) setSnapshot(s ?? null); });
    void outboxItems(surveyId).then((o) => { if (live) setOutbox(o); });
    return () => { live = false; };
  }, [surveyId]);

  // A survey already taken offline is refreshed whenever the server answers.
  useEffect(() => {
    if (!server.data || !snapshot) return;
    if (snapshot.savedAt >= server.dataUpdatedAt) return;
    const next = { ...snapshot, state: server.data, savedAt: server.dataUpdatedAt };
    void saveSnapshot(next).then(() => setSnapshot(next));
  }, [server.data, server.dataUpdatedAt, snapshot]);

  // A pass that stopped early (server unreachable or at fault) is tried again on a timer with
  // back-off, not only on the 'online' event, which a phone may never fire (see retryDelayMs).
  const [reachable, setReachable] = useState(true);
  const [retryAt, setRetryAt] = useState<number | null>(null);
  const failedPasses = useRef(0);
  const retryTimer = useRef<ReturnType<typeof setTimeout> | undefined>(undefined);
  const latestSync = useRef<(retry: boolean) => Promise<void>>(async () => {});

  /** One pass; only passes the timer started lengthen the wait (a new record or a tap starts afresh). */
  const sync = useCallback(async (retry = false) => {
    clearTimeout(retryTimer.current);
    if (!retry) failedPasses.current = 0;
    setRetryAt(null);
    if (!navigator.onLine) return; // the 'online' event starts the next pass
    setSyncing(true);
    try {
      const out = await syncOutbox();
      await refreshOutbox();
      setReachable(out.stopped !== 'unreachable');
      // Synced records change the survey's readings and verdicts as well as its field state.
      if (out.sent > 0 || out.refused > 0) await qc.invalidateQueries({ queryKey: surveyKeys.detail(surveyId) });
      if (out.stopped === null) {
        failedPasses.current = 0;
      } else {
        failedPasses.current += 1;
        const delay = retryDelayMs(failedPasses.current);
        setRetryAt(Date.now() + delay);
        retryTimer.current = setTimeout(() => void latestSync.current(true), delay);
      }
    } finally {
      setSyncing(false);
    }
  }, [qc, refreshOutbox, surveyId]);

  // Back online or back on screen: send what waits. Also once on opening, for items left from an earlier visit.
  useEffect(() => {
    latestSync.current = sync;
    const run = () => void sync();
    const onShown = () => { if (document.visibilityState === 'visible') run(); };
    window.addEventListener('online', run);
    document.addEventListener('visibilitychange', onShown);
    const first = setTimeout(run, 0);
    return () => {
      window.removeEventListener('online', run);
      document.removeEventListener('visibilitychange', onShown);
      clearTimeout(first);
      clearTimeout(retryTimer.current);
    };
  }, [sync]);

  const add = useCallback(async (item: OutboxItem) => {
    await enqueue(item);
    await refreshOutbox();
    if (navigator.onLine) void sync();
  }, [refreshOutbox, sync]);

  const discard = useCallback(async (key: string) => {
    await removeItem(key);
    await refreshOutbox();
  }, [refreshOutbox]);

  /** Keeps the survey, its plans' images and its planned points on the phone. */
  const takeOffline = useCallback(async () => {
    setTakingOffline(true);
    try {
      const state = await qc.fetchQuery({ ...fieldStateQueryOptions(surveyId), staleTime: 0 });
      const images: Record<number, Blob> = {};
      for (const p of state.plans) {
        const res = await fetch(p.imageUrl, { credentials: 'same-origin' });
        if (!res.ok) throw new Error(`The image of plan ${p.name} could not be fetched (${res.status})`);
        images[p.id] = await res.blob();
      }
      const s: OfflineSnapshot = { surveyId, state, images, savedAt: Date.now() };
      await saveSnapshot(s);
      setSnapshot(s);
    } finally {
      setTakingOffline(false);
    }
  }, [qc, surveyId]);

  const state: FieldState | null = server.data ?? snapshot?.state ?? null;
  return {
    state, online: online && reachable, server, snapshot, outbox, syncing, retryAt, takingOffline, add, discard, sync, takeOffline,
    loading: !state && (server.isPending || snapshot === undefined),
    fromPhone: !server.data && !!snapshot,
  };
}
