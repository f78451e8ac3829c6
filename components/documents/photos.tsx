/**
 * Photos of a reading or a deficiency: a strip of thumbnails, each with how it stands in words
 * (on this device / uploading NN % / synced / refused: why), tap for the full size, and "Add
 * photo" (the camera on a phone, a file picker on the web). `PhotosWaiting` is the Sync tab's
 * list of photos still on this device.
 */
import { useState } from 'react';
import { Image, Modal, Pressable, StyleSheet, View } from 'react-native';
import { Card } from '@/components/ui/card';
import { useAddPhotos, usePhotos, useRemovePhoto, useWaitingPhotos, type ShownPhoto } from '@/hooks/use-photos';
import { confirmAction } from '@/lib/confirm';
import type { PhotoStatus } from '@/lib/photo-queue';
import type { Photo } from '@/shared/records';
import { Button } from '@/components/ui/button';
import { Text } from '@/components/ui/text';
import { colours, MIN_TOUCH, radii, space } from '@/components/ui/theme';

const THUMB = 112;

const MARKS: Record<PhotoStatus['tone'], string> = { waiting: '○', busy: '↑', done: '✓', refused: '!' };

function statusLine(status: PhotoStatus): string {
  if (status.tone === 'busy') return `${status.word} ${status.detail}`;
  if (status.tone === 'refused') return `${status.word}: ${status.detail}`;
  return status.word;
}

function kb(bytes: number): string {
  return bytes >= 1024 * 1024 ? `${(bytes / 1024 / 1024).toFixed(1)} MB` : `${Math.max(1, Math.round(bytes / 1024))} kB`;
}

function takenWords(iso: string): string {
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? '' : d.toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}

export function PhotoStrip({
  buildingId,
  parentKind,
  parentId,
  purpose,
  canAdd,
  label,
}: {
  buildingId: string;
  parentKind: Photo['parentKind'];
  parentId: string;
  purpose: Photo['purpose'];
  canAdd: boolean;
  /** the add button's words (default "Add photo") */
  label?: string;
}) {
  const photos = usePhotos(buildingId, parentKind, parentId, purpose);
  const adding = useAddPhotos({ buildingId, parentKind, parentId, purpose });
  const [open, setOpen] = useState<string | null>(null);
  const opened = photos?.find((p) => p.photo.id === open) ?? null;
  const addLabel = label ?? 'Add photo';

  return (
    <View style={styles.strip} testID="photo-strip">
      {photos && photos.length === 0 && (
        <Text tone="soft" testID="photo-empty">
          No photos yet.{canAdd ? ` Use “${addLabel}” to take or choose one.` : ''}
        </Text>
      )}
      {photos && photos.length > 0 && (
        <View style={styles.row}>
          {photos.map((p) => (
            <Thumb key={p.photo.id} shown={p} onOpen={() => setOpen(p.photo.id)} />
          ))}
        </View>
      )}
      {canAdd && (
        <Button
          label={adding.busy ? 'Keeping the photo on this device…' : addLabel}
          tone="secondary"
          busy={adding.busy}
          onPress={() => void adding.add()}
          testID="add-photo"
          style={styles.add}
        />
      )}
      {adding.problem && (
        <View style={styles.problem} accessibilityRole="alert" testID="photo-problem">
          <Text variant="small">! {adding.problem}</Text>
        </View>
      )}
      {opened && <Viewer shown={opened} canRemove={canAdd} buildingId={buildingId} onClose={() => setOpen(null)} />}
    </View>
  );
}

function Thumb({ shown, onOpen }: { shown: ShownPhoto; onOpen: () => void }) {
  const [failed, setFailed] = useState(false);
  const { status } = shown;
  const line = statusLine(status);
  const pct = status.fraction === null ? null : Math.min(100, Math.round(status.fraction * 100));
  return (
    <View style={styles.thumbColumn} testID="photo-thumb">
      <Pressable
        onPress={onOpen}
        testID="photo-open"
        accessibilityRole="button"
        accessibilityLabel={`Photo taken ${takenWords(shown.photo.takenAt)}, ${line}. Open full size`}
        style={({ pressed }) => [styles.thumbFrame, pressed && styles.pressed]}
      >
        {shown.thumbUri && !failed ? (
          <Image source={{ uri: shown.thumbUri }} style={styles.thumb} resizeMode="cover" onError={() => setFailed(true)} />
        ) : (
          <View style={[styles.thumb, styles.placeholder]}>
            <Text variant="small" tone="soft" style={styles.centreText}>
              {shown.thumbUri ? 'needs the signal to show' : 'no preview yet'}
            </Text>
          </View>
        )}
      </Pressable>
      {pct !== null && (
        <View
          style={styles.track}
          testID="photo-progress"
          accessibilityRole="progressbar"
          accessibilityValue={{ min: 0, max: 100, now: pct }}
        >
          <View style={[styles.fill, { width: `${pct}%` }]} />
        </View>
      )}
      <Text variant="label" tone={status.tone === 'refused' ? 'danger' : status.tone === 'done' ? 'ink' : 'soft'} numberOfLines={3} testID="photo-status">
        {MARKS[status.tone]} {line}
      </Text>
      {status.tone === 'waiting' && status.detail ? (
        <Text variant="small" tone="faint" numberOfLines={2}>
          {status.detail}
        </Text>
      ) : null}
    </View>
  );
}

function Viewer({ shown, canRemove, buildingId, onClose }: { shown: ShownPhoto; canRemove: boolean; buildingId: string; onClose: () => void }) {
  const remove = useRemovePhoto();
  const [failed, setFailed] = useState(false);
  const { photo, status } = shown;
  const removePhoto = async () => {
    const waiting = shown.local && status.word !== 'synced';
    const ok = await confirmAction(
      'Remove this photo?',
      waiting
        ? 'It has not reached the server yet: removing it deletes it from this device for good.'
        : 'It is removed for everyone who can see this record.',
      'Remove photo',
    );
    if (!ok) return;
    remove(buildingId, photo.id);
    onClose();
  };
  return (
    <Modal visible animationType="none" onRequestClose={onClose} transparent={false}>
      <View style={styles.viewer} testID="photo-viewer">
        <View style={styles.viewerImage}>
          {shown.fullUri && !failed ? (
            <Image
              source={{ uri: shown.fullUri }}
              style={styles.full}
              resizeMode="contain"
              accessibilityLabel="The photo, full size"
              onError={() => setFailed(true)}
              testID="photo-full"
            />
          ) : (
            <Text tone="paper" style={styles.centreText}>
              {shown.fullUri
                ? 'The full-size photo needs the signal: it is kept on the server, not on this device.'
                : 'This photo has not reached the server yet; it is on the device that took it.'}
            </Text>
          )}
        </View>
        <View style={styles.viewerBar}>
          <Text variant="strong" tone="paper">
            {MARKS[status.tone]} {statusLine(status)}
          </Text>
          <Text variant="small" tone="paper">
            Taken {takenWords(photo.takenAt)} · {kb(photo.bytes)}
            {photo.width && photo.height ? ` · ${photo.width} × ${photo.height} px` : ''}
          </Text>
          {photo.caption ? <Text tone="paper">{photo.caption}</Text> : null}
          <View style={styles.viewerActions}>
            <Button label="Close" onPress={onClose} testID="photo-close" />
            {canRemove && <Button label="Remove photo" tone="danger" onPress={() => void removePhoto()} testID="photo-remove" />}
          </View>
        </View>
      </View>
    </Modal>
  );
}

/** The Sync tab's section: photos still on this device, each with its progress. */
export function PhotosWaiting() {
  const { photos, refused } = useWaitingPhotos();
  const waiting = photos.length - refused;
  return (
    <Card testID="photos-waiting">
      <Text variant="label" tone="soft">
        PHOTOS ({photos.length})
      </Text>
      {photos.length === 0 ? (
        <Text tone="soft">No photos waiting: every photo taken here has reached the server.</Text>
      ) : (
        <>
          {waiting > 0 && (
            <View style={styles.warn} accessibilityRole="alert" testID="photos-waiting-count">
              <Text variant="strong">
                {waiting} {waiting === 1 ? 'photo' : 'photos'} waiting on this device
              </Text>
              <Text variant="small">
                They upload by themselves when there is signal. Until then they exist only here: keep this device, stay signed
                in and do not clear the browser’s data.
              </Text>
            </View>
          )}
          {photos.map((p) => {
            const pct = p.status.fraction === null ? null : Math.min(100, Math.round(p.status.fraction * 100));
            return (
              <View key={p.id} style={styles.waitingRow} testID="photo-waiting">
                <View style={styles.flex}>
                  <Text>{p.label}</Text>
                  <Text variant="small" tone={p.status.tone === 'refused' ? 'danger' : 'faint'}>
                    {MARKS[p.status.tone]} {statusLine(p.status)}
                    {p.status.tone === 'waiting' && p.status.detail ? ` · ${p.status.detail}` : ''} · {kb(p.bytes)}
                  </Text>
                  {pct !== null && (
                    <View style={styles.track} testID="photo-progress" accessibilityRole="progressbar" accessibilityValue={{ min: 0, max: 100, now: pct }}>
                      <View style={[styles.fill, { width: `${pct}%` }]} />
                    </View>
                  )}
                </View>
              </View>
            );
          })}
        </>
      )}
    </Card>
  );
}

const styles = StyleSheet.create({
  strip: { gap: space.md },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  thumbColumn: { width: THUMB, gap: space.xs },
  thumbFrame: { width: THUMB, height: THUMB, minHeight: MIN_TOUCH, borderRadius: radii.md, overflow: 'hidden', borderWidth: 1, borderColor: colours.rule },
  pressed: { opacity: 0.8 },
  thumb: { width: THUMB, height: THUMB, backgroundColor: colours.rule },
  placeholder: { alignItems: 'center', justifyContent: 'center', padding: space.xs, backgroundColor: colours.paper },
  centreText: { textAlign: 'center' },
  track: { height: 6, borderRadius: 3, backgroundColor: colours.rule, overflow: 'hidden' },
  fill: { height: 6, backgroundColor: colours.copper },
  add: { alignSelf: 'flex-start' },
  problem: { backgroundColor: colours.warnSoft, padding: space.sm, borderRadius: radii.sm },
  viewer: { flex: 1, backgroundColor: colours.ink },
  viewerImage: { flex: 1, alignItems: 'center', justifyContent: 'center', padding: space.sm },
  full: { width: '100%', height: '100%' },
  viewerBar: { padding: space.lg, gap: space.xs, borderTopWidth: 1, borderTopColor: colours.inkSoft },
  viewerActions: { flexDirection: 'row', gap: space.sm, flexWrap: 'wrap', marginTop: space.sm },
  warn: { backgroundColor: colours.warnSoft, padding: space.md, borderRadius: radii.md, gap: space.xs },
  waitingRow: { flexDirection: 'row', gap: space.sm, paddingVertical: space.xs, borderBottomWidth: StyleSheet.hairlineWidth, borderBottomColor: colours.rule },
  flex: { flex: 1, gap: space.xs },
});
