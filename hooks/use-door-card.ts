/**
 * Read a door card: pick a photo (camera on a phone, a file on the web) → read its text on the
 * device (lib/ocr) → the parser's draft (shared/door-card) → the review's decisions → the CSV
 * import's checks and plan (planDoorCard) → one batch of queued circuit mutations through the
 * same apply as the CSV import, so it works offline like any edit.
 */
import * as ImagePicker from 'expo-image-picker';
import { useCallback, useMemo, useState } from 'react';
import { Platform } from 'react-native';
import { recognizeCard } from '@/lib/ocr';
import type { OcrProgress } from '@/lib/ocr-types';
import { planDoorCard, type AcceptedLine, type CardPlan } from '@/shared/door-card/check';
import { needsLook, parseDoorCard, type DoorCardDraft, type DraftCircuit } from '@/shared/door-card/parse';
import { useCsvContext, useScheduleImport } from './use-csv';

export type LineDecision = 'accept' | 'skip' | 'undecided';

export interface ReviewLine extends DraftCircuit {
  decision: LineDecision;
  /** true once the user changed what was read */
  edited: boolean;
}

export interface CardPhoto {
  uri: string;
  width: number;
  height: number;
}

export type LineEdit = Pick<DraftCircuit, 'position' | 'poles' | 'ratingA' | 'description' | 'status'>;

/** Lines that read cleanly start accepted; a marked line waits for the user's word. */
function reviewOf(draft: DoorCardDraft): ReviewLine[] {
  return draft.circuits.map((c) => ({ ...c, decision: needsLook(c) ? 'undecided' : 'accept', edited: false }));
}

async function pickPhoto(): Promise<ImagePicker.ImagePickerAsset | null> {
  if (Platform.OS !== 'web') {
    const permission = await ImagePicker.requestCameraPermissionsAsync();
    if (!permission.granted) throw new Error('The camera was not allowed: allow it in the phone’s settings to photograph a card.');
    const shot = await ImagePicker.launchCameraAsync({ mediaTypes: ['images'], quality: 1 });
    return shot.canceled ? null : shot.assets[0];
  }
  const chosen = await ImagePicker.launchImageLibraryAsync({ mediaTypes: ['images'], quality: 1 });
  return chosen.canceled ? null : chosen.assets[0];
}

export function useDoorCard(panelId: string) {
  const { query, found, ctx } = useCsvContext(panelId);
  const importer = useScheduleImport(panelId);
  const [photo, setPhoto] = useState<CardPhoto | null>(null);
  const [progress, setProgress] = useState<OcrProgress | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [lines, setLines] = useState<ReviewLine[] | null>(null);
  const [unread, setUnread] = useState<DoorCardDraft['unread']>([]);
  const [readMs, setReadMs] = useState<number | null>(null);

  const read = useCallback(async () => {
    setError(null);
    try {
      const asset = await pickPhoto();
      if (!asset) return;
      setLines(null);
      setProgress({ step: 'Starting the reader', share: 0 });
      const result = await recognizeCard({ uri: asset.uri, file: asset.file ?? undefined }, setProgress);
      // every position is read, so one past the panel's spaces meets the import's check, not silence
      const draft = parseDoorCard(result.lines);
      setPhoto({ uri: result.imageUrl, width: result.width, height: result.height });
      setUnread(draft.unread);
      setReadMs(result.ms);
      setLines(reviewOf(draft));
    } catch (e) {
      setError(e instanceof Error ? e.message : String(e));
    } finally {
      setProgress(null);
    }
  }, []);

  const decide = useCallback((key: string, decision: LineDecision) => {
    setLines((ls) => ls && ls.map((l) => (l.key === key ? { ...l, decision } : l)));
  }, []);

  /** an edited line is accepted: the user has looked at it */
  const edit = useCallback((key: string, fields: LineEdit) => {
    setLines((ls) => ls && ls.map((l) => (l.key === key ? { ...l, ...fields, decision: 'accept', edited: true } : l)));
  }, []);

  const card = useMemo((): CardPlan | null => {
    if (!lines || !ctx || !found) return null;
    const accepted: AcceptedLine[] = lines
      .filter((l) => l.decision === 'accept')
      .map(({ key, position, poles, ratingA, description, status }) => ({ key, position, poles, ratingA, description, status }));
    return planDoorCard(accepted, ctx, found.circuits);
  }, [lines, ctx, found]);

  return {
    query,
    found,
    photo,
    progress,
    error,
    lines,
    unread,
    readMs,
    card,
    read,
    decide,
    edit,
    /** one batch of queued mutations, the CSV import's own apply */
    apply() {
      if (!card) return;
      importer.apply(card.plan);
      setLines(null);
      setPhoto(null);
    },
    discard() {
      setLines(null);
      setPhoto(null);
      setUnread([]);
    },
  };
}
