import * as ImagePicker from 'expo-image-picker';
import { useEffect, useRef, useState } from 'react';
import { Image, Linking, Platform, Pressable, StyleSheet, View } from 'react-native';
import type { Lane } from '../../shared/schemas/burn';
import { ApiError, apiRequest, schemaKit, setCsrfToken } from '../api/client';
import { bannerMessage } from '../api/error-messages';
import { newClientId } from '../client-id';
import { apiBaseUrl } from '../config';
import { colors, radius, space } from '../theme';
import { Banner } from '../ui/banner';
import { Button } from '../ui/button';
import { printHide } from '../ui/print';
import { AppText } from '../ui/text';

type Stage = 'before' | 'after';
const stages: readonly { stage: Stage; title: string; add: string; take: string }[] = [
  { stage: 'before', title: 'Before', add: 'Add a before photo', take: 'Take a before photo' },
  { stage: 'after', title: 'After', add: 'Add an after photo', take: 'Take an after photo' },
];

const THUMB_HEIGHT = 96;

/**
 * What goes into the form's `photo` part. On the web a Blob (kept, so a retry sends the very same
 * bytes even after the picker's blob: URL is gone); on a phone React Native's `{ uri, name, type }`
 * descriptor, which its FormData streams from the file.
 */
type PhotoPart =
  | { kind: 'blob'; blob: Blob; name: string }
  | { kind: 'file'; uri: string; name: string; type: string };

type Upload = {
  clientId: string;
  stage: Stage;
  part: PhotoPart;
  phase: 'sending' | 'failed';
  percent: number | null;
  error?: string;
};

const extensions: Record<string, string> = {
  'image/jpeg': 'jpg',
  'image/png': 'png',
  'image/webp': 'webp',
  'image/heic': 'heic',
  'image/heif': 'heif',
  'image/avif': 'avif',
};

function fileNameFor(asset: ImagePicker.ImagePickerAsset, type: string): string {
  const name = asset.fileName ?? asset.file?.name;
  if (name) return name;
  return `photo.${extensions[type] ?? 'jpg'}`;
}

async function partFor(asset: ImagePicker.ImagePickerAsset): Promise<PhotoPart> {
  const type = asset.mimeType ?? asset.file?.type ?? 'image/jpeg';
  const name = fileNameFor(asset, type);
  if (Platform.OS !== 'web') return { kind: 'file', uri: asset.uri, name, type };
  if (asset.file) return { kind: 'blob', blob: asset.file, name };
  const blob = await (await fetch(asset.uri)).blob();
  return { kind: 'blob', blob, name };
}

function uploadErrorText(error: unknown): string {
  if (error instanceof ApiError) {
    if (error.status === 415) return 'That file is not a photo we can store (JPEG, PNG or WebP).';
    if (error.status === 413 || error.code === 'payload_too_large') {
      return 'That photo is too large.';
    }
    if (error.code === 'network') return 'The upload did not go through.';
    // A 400 here has no form fields to mark; the server's sentence says what was wrong.
    if (error.code === 'invalid_request') return error.message;
  }
  return bannerMessage(error);
}

function readBody(xhr: XMLHttpRequest): unknown {
  try {
    return JSON.parse(xhr.responseText) as unknown;
  } catch {
    return undefined;
  }
}

/**
 * Sends the form with XMLHttpRequest rather than fetch, because only XHR reports upload
 * progress. Cookies carry the sign-in, so the write needs the session's CSRF token.
 */
async function sendForm(
  url: string,
  csrfToken: string,
  form: FormData,
  onProgress: (percent: number | null) => void,
  track: (xhr: XMLHttpRequest | undefined) => void,
): Promise<void> {
  const kit = await schemaKit();
  const storedPhotoSchema = kit.laneSchema.shape.photos.element;
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    track(xhr);
    xhr.open('POST', url);
    xhr.withCredentials = true;
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.setRequestHeader('X-CSRF-Token', csrfToken);
    xhr.upload.onprogress = (e) => {
      onProgress(e.lengthComputable && e.total > 0 ? Math.round((e.loaded / e.total) * 100) : null);
    };
    xhr.onload = () => {
      track(undefined);
      const body = readBody(xhr);
      if (xhr.status >= 200 && xhr.status < 300) {
        if (storedPhotoSchema.safeParse(body).success) resolve();
        else
          reject(
            new ApiError(
              xhr.status,
              'unexpected_response',
              'The server sent an answer this app does not understand.',
            ),
          );
        return;
      }
      const error = kit.errorBodySchema.safeParse(body);
      if (error.success) {
        const { code, message, fields } = error.data.error;
        reject(new ApiError(xhr.status, code, message, fields));
      } else {
        reject(
          new ApiError(
            xhr.status,
            xhr.status === 413 ? 'payload_too_large' : 'unexpected_response',
            `The server answered with status ${xhr.status}.`,
          ),
        );
      }
    };
    const networkError = () => {
      track(undefined);
      reject(new ApiError(0, 'network', 'The upload did not go through.'));
    };
    xhr.onerror = networkError;
    xhr.ontimeout = networkError;
    xhr.onabort = () => {
      track(undefined);
      reject(new ApiError(0, 'aborted', 'The upload was stopped.'));
    };
    xhr.send(form);
  });
}

/** A lane's photos (before and after the burn), and for editors a way to add more. */
export function PhotoStrip({
  labId,
  pairId,
  lane,
  canEdit,
  onUploaded,
}: {
  labId: string;
  pairId: string;
  lane: Lane;
  canEdit: boolean;
  onUploaded: () => void;
}) {
  const code = lane.specimen.code;
  const [upload, setUpload] = useState<Upload>();
  const [pickError, setPickError] = useState<string>();
  const [picking, setPicking] = useState(false);
  const xhrRef = useRef<XMLHttpRequest | undefined>(undefined);
  const mounted = useRef(true);
  const camera = Platform.OS !== 'web';

  useEffect(() => {
    mounted.current = true;
    return () => {
      mounted.current = false;
      xhrRef.current?.abort();
    };
  }, []);

  const photoUrl = (id: string, thumbnail: boolean) =>
    `${apiBaseUrl}/api/labs/${labId}/photos/${id}${thumbnail ? '/thumbnail' : ''}`;

  async function send(job: Omit<Upload, 'phase' | 'percent' | 'error'>) {
    setUpload({ ...job, phase: 'sending', percent: 0 });
    try {
      // Asked right before sending: it also renews a lapsed access cookie, and the token is the
      // one for the session the upload will run in.
      const { me } = await apiRequest('/api/auth/session', (k) => k.sessionStateSchema);
      if (!me) throw new ApiError(401, 'unauthenticated', 'Your sign-in has ended.');
      setCsrfToken(me.csrfToken);
      const form = new FormData();
      form.append('clientId', job.clientId);
      form.append('specimenId', lane.specimen.id);
      form.append('stage', job.stage);
      if (job.part.kind === 'blob') form.append('photo', job.part.blob, job.part.name);
      else {
        // React Native's FormData takes a file descriptor where the web takes a Blob.
        const { uri, name, type } = job.part;
        form.append('photo', { uri, name, type } as unknown as Blob);
      }
      await sendForm(
        `${apiBaseUrl}/api/labs/${labId}/pairs/${pairId}/photos`,
        me.csrfToken,
        form,
        (percent) => {
          if (mounted.current) setUpload((u) => (u ? { ...u, percent } : u));
        },
        (xhr) => {
          xhrRef.current = xhr;
        },
      );
      if (!mounted.current) return;
      setUpload(undefined);
      onUploaded();
    } catch (err) {
      if (!mounted.current) return;
      setUpload({ ...job, phase: 'failed', percent: null, error: uploadErrorText(err) });
    }
  }

  async function pick(stage: Stage, from: 'library' | 'camera') {
    setPickError(undefined);
    setPicking(true);
    try {
      if (from === 'camera') {
        const permission = await ImagePicker.requestCameraPermissionsAsync();
        if (!permission.granted) {
          setPickError(
            'Quenchbook may not use the camera. Allow it in the settings, or choose a saved photo.',
          );
          return;
        }
      }
      const options: ImagePicker.ImagePickerOptions = { mediaTypes: ['images'], quality: 0.9 };
      const result =
        from === 'camera'
          ? await ImagePicker.launchCameraAsync(options)
          : await ImagePicker.launchImageLibraryAsync(options);
      const asset = result.canceled ? undefined : result.assets[0];
      if (!asset) return;
      const part = await partFor(asset);
      // One clientId per photo, kept for retries, so the server stores it once however often
      // it is sent.
      void send({ clientId: newClientId(), stage, part });
    } catch {
      if (mounted.current) setPickError('The photo could not be opened. Please try another.');
    } finally {
      if (mounted.current) setPicking(false);
    }
  }

  const sending = upload?.phase === 'sending';

  return (
    <View style={styles.strip} testID={`photos-${code}`}>
      {stages.map(({ stage, title, add, take }) => {
        const photos = lane.photos.filter((p) => p.stage === stage);
        return (
          <View key={stage} style={styles.group} testID={`photos-${stage}-${code}`}>
            <AppText variant="label">
              {title}
              {photos.length > 0 ? ` (${photos.length})` : ''}
            </AppText>
            {photos.length === 0 ? (
              <AppText variant="small" tone="muted">
                No photo yet.
              </AppText>
            ) : (
              <View style={styles.thumbs}>
                {photos.map((p, i) => {
                  const label = `${title} photo ${i + 1} of ${code}`;
                  const width = Math.min(
                    THUMB_HEIGHT * 2,
                    Math.max(THUMB_HEIGHT / 2, (THUMB_HEIGHT * p.width) / Math.max(1, p.height)),
                  );
                  return (
                    <Pressable
                      key={p.id}
                      accessibilityRole="link"
                      accessibilityLabel={`${label}, open at full size`}
                      onPress={() => void Linking.openURL(photoUrl(p.id, false))}
                      testID={`photo-${p.id}`}
                    >
                      <Image
                        source={{ uri: photoUrl(p.id, true) }}
                        alt={label}
                        resizeMode="cover"
                        style={[styles.thumb, { width }]}
                      />
                    </Pressable>
                  );
                })}
              </View>
            )}
            {canEdit ? (
              <View style={styles.actions} {...printHide}>
                <Button
                  label={add}
                  tone="secondary"
                  compact
                  disabled={sending || picking}
                  onPress={() => void pick(stage, 'library')}
                  testID={`add-photo-${stage}-${code}`}
                />
                {camera ? (
                  <Button
                    label={take}
                    tone="secondary"
                    compact
                    disabled={sending || picking}
                    onPress={() => void pick(stage, 'camera')}
                    testID={`take-photo-${stage}-${code}`}
                  />
                ) : null}
              </View>
            ) : null}
          </View>
        );
      })}

      {pickError ? <Banner tone="error" message={pickError} testID="photo-pick-error" /> : null}

      {upload?.phase === 'sending' ? (
        <View style={styles.progress} testID="upload-progress" {...printHide}>
          <AppText variant="small">
            Uploading the {upload.stage} photo
            {upload.percent === null ? '…' : `: ${upload.percent} %`}
          </AppText>
          <View
            style={styles.track}
            role="progressbar"
            aria-label={`Uploading the ${upload.stage} photo`}
            aria-valuemin={0}
            aria-valuemax={100}
            aria-valuenow={upload.percent ?? undefined}
          >
            <View style={[styles.bar, { width: `${upload.percent ?? 0}%` }]} />
          </View>
        </View>
      ) : null}

      {upload?.phase === 'failed' ? (
        <View style={styles.progress} {...printHide}>
          <Banner
            tone="error"
            message={upload.error ?? 'The upload did not go through.'}
            testID="upload-error"
          />
          <View style={styles.actions}>
            <Button
              label="Try again"
              compact
              onPress={() =>
                void send({ clientId: upload.clientId, stage: upload.stage, part: upload.part })
              }
              testID="retry-upload"
            />
            <Button
              label="Leave it"
              tone="secondary"
              compact
              onPress={() => setUpload(undefined)}
              testID="dismiss-upload"
            />
          </View>
        </View>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  strip: { gap: space.md },
  group: { gap: space.xs },
  thumbs: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  thumb: {
    height: THUMB_HEIGHT,
    borderRadius: radius.sm,
    borderWidth: 1,
    borderColor: colors.line,
    backgroundColor: colors.paper,
  },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm, marginTop: space.xs },
  progress: { gap: space.xs },
  track: {
    height: 4,
    borderRadius: 2,
    backgroundColor: colors.line,
    overflow: 'hidden',
  },
  bar: { height: 4, backgroundColor: colors.primary },
});
