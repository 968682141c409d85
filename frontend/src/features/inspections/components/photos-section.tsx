import { useEffect, useRef, useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { ConfirmDialog } from 'primereact/confirmdialog';
import { Dialog } from 'primereact/dialog';
import { InputText } from 'primereact/inputtext';
import { ProgressBar } from 'primereact/progressbar';
import { Skeleton } from 'primereact/skeleton';
import { PHOTO_CAPTION_MAX_LENGTH, PHOTO_MAX_BYTES, type InspectionPhoto } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { useNotify } from '@/components/notify';
import { isApiError } from '@/lib/api-client';
import { formatRecent } from '@/lib/format';
import { useLastValue } from '@/lib/use-last-value';
import { serverFormErrors } from '@/lib/form-errors';
import { FormField } from '@/components/form-field';
import { useDeletePhoto } from '../api/delete-photo';
import { usePhotoBlob, usePhotos } from '../api/get-photos';
import { useUpdatePhotoCaption } from '../api/update-photo-caption';
import { useUploadPhoto } from '../api/upload-photo';

const MB = PHOTO_MAX_BYTES / (1024 * 1024);

function sizeText(bytes: number): string {
  return bytes >= 1024 * 1024
    ? `${(bytes / (1024 * 1024)).toFixed(1)} MB`
    : `${Math.max(1, Math.round(bytes / 1024))} KB`;
}

/** An object URL for a Blob while it is on screen; revoked when it goes. */
function useObjectUrl(blob: Blob | undefined): string | null {
  const [url, setUrl] = useState<string | null>(null);
  useEffect(() => {
    if (!blob) return;
    const made = URL.createObjectURL(blob);
    setUrl(made);
    return () => {
      URL.revokeObjectURL(made);
      setUrl(null);
    };
  }, [blob]);
  return url;
}

interface PhotosSectionProps {
  inspectionId: string;
  /** Uploads while the inspection is not cancelled; deletes only while it is booked. */
  canUpload: boolean;
  canDelete: boolean;
  /** Captions can be corrected whenever the person may change the inspection, completed ones too. */
  canEditCaption: boolean;
}

export function PhotosSection({ inspectionId, canUpload, canDelete, canEditCaption }: PhotosSectionProps) {
  const photos = usePhotos(inspectionId);
  const notify = useNotify();
  const remove = useDeletePhoto();
  const [viewing, setViewing] = useState<InspectionPhoto | null>(null);
  const [deleting, setDeleting] = useState<InspectionPhoto | null>(null);
  const [captioning, setCaptioning] = useState<InspectionPhoto | null>(null);
  const shownDeleting = useLastValue(deleting);

  return (
    <div className="photos">
      {canUpload ? <UploadForm inspectionId={inspectionId} /> : null}
      {photos.isPending ? (
        <div className="photo-grid">
          {Array.from({ length: 3 }, (_, i) => (
            <Skeleton key={i} height="9rem" />
          ))}
        </div>
      ) : photos.isError ? (
        <ApiErrorMessage error={photos.error} />
      ) : photos.data.length === 0 ? (
        <EmptyState icon="pi-camera" title="No photos yet">
          Photograph every crack with a tape or a coin beside it for scale, the grading, and the downspouts.
        </EmptyState>
      ) : (
        <ul className="photo-grid" aria-label="Photos">
          {photos.data.map((p, i) => (
            <li key={p.id} className="photo-card">
              <button
                type="button"
                className="photo-card__open"
                onClick={() => setViewing(p)}
                aria-label={`Open photo ${i + 1}${p.caption ? `: ${p.caption}` : ''}`}
              >
                <Thumbnail photo={p} />
              </button>
              <div className="photo-card__meta">
                <p className="photo-card__caption">
                  {p.caption ?? <span className="muted">No caption</span>}
                </p>
                <p className="photo-card__by muted">
                  {p.uploadedBy.name} · {formatRecent(p.createdAt)}
                </p>
              </div>
              {canEditCaption ? (
                <Button
                  type="button"
                  icon="pi pi-pencil"
                  aria-label={`Edit caption of photo ${i + 1}${p.caption ? `: ${p.caption}` : ''}`}
                  text
                  rounded
                  className="photo-card__edit"
                  onClick={() => setCaptioning(p)}
                />
              ) : null}
              {canDelete ? (
                <Button
                  type="button"
                  icon="pi pi-trash"
                  aria-label={`Delete photo ${i + 1}${p.caption ? `: ${p.caption}` : ''}`}
                  text
                  rounded
                  severity="danger"
                  className="photo-card__delete"
                  loading={remove.isPending && remove.variables?.id === p.id}
                  onClick={() => setDeleting(p)}
                />
              ) : null}
            </li>
          ))}
        </ul>
      )}
      <PhotoDialog photo={viewing} onClose={() => setViewing(null)} />
      <CaptionDialog photo={captioning} onClose={() => setCaptioning(null)} />
      <ConfirmDialog
        visible={deleting !== null}
        onHide={() => setDeleting(null)}
        header="Delete photo"
        icon="pi pi-exclamation-triangle"
        message={
          shownDeleting
            ? `Delete this photo${shownDeleting.caption ? ` (“${shownDeleting.caption}”)` : ''}? This cannot be undone.`
            : ''
        }
        acceptLabel="Delete photo"
        rejectLabel="Keep it"
        acceptClassName="p-button-danger"
        defaultFocus="reject"
        accept={() => {
          const photo = deleting;
          setDeleting(null);
          if (!photo) return;
          remove.mutate(photo, {
            onSuccess: () => notify.success('Photo deleted'),
            onError: (e) =>
              notify.error('The photo was not deleted', isApiError(e) ? e.message : 'Try again.'),
          });
        }}
        reject={() => setDeleting(null)}
        className="app-dialog"
      />
    </div>
  );
}

function Thumbnail({ photo }: { photo: InspectionPhoto }) {
  const blob = usePhotoBlob(photo.thumbnailUrl);
  const url = useObjectUrl(blob.data);
  if (!photo.thumbnailUrl) {
    return (
      <span className="photo-card__placeholder">
        <i className="pi pi-image" aria-hidden="true" />
        <span>{photo.thumbnailNote ?? 'No preview'}</span>
      </span>
    );
  }
  if (blob.isError) {
    return (
      <span className="photo-card__placeholder">
        <i className="pi pi-exclamation-triangle" aria-hidden="true" />
        <span>Preview could not be loaded</span>
      </span>
    );
  }
  return url ? (
    <img src={url} alt={photo.caption ?? 'Inspection photo'} className="photo-card__img" />
  ) : (
    <Skeleton height="100%" />
  );
}

function PhotoDialog({ photo, onClose }: { photo: InspectionPhoto | null; onClose: () => void }) {
  const shown = useLastValue(photo);
  const blob = usePhotoBlob(photo ? photo.contentUrl : null);
  const url = useObjectUrl(blob.data);
  // Browsers other than Safari cannot show HEIC: offer the file instead.
  const showable = shown && shown.contentType !== 'image/heic';
  return (
    <Dialog
      visible={photo !== null}
      onHide={onClose}
      header={shown?.caption ?? 'Photo'}
      className="app-dialog photo-dialog"
      style={{ width: '60rem' }}
      breakpoints={{ '900px': 'calc(100vw - 1rem)' }}
      draggable={false}
      resizable={false}
      dismissableMask
    >
      {blob.isError ? (
        <ApiErrorMessage error={blob.error} />
      ) : !url ? (
        <Skeleton height="50vh" />
      ) : showable ? (
        <img src={url} alt={shown.caption ?? 'Inspection photo'} className="photo-dialog__img" />
      ) : (
        <p>
          This browser cannot show HEIC photos.{' '}
          <a href={url} download={`photo-${shown?.id ?? ''}.heic`}>
            Download the photo
          </a>
        </p>
      )}
      {shown ? (
        <p className="muted photo-dialog__meta">
          {shown.uploadedBy.name} · {formatRecent(shown.createdAt)} · {sizeText(shown.sizeBytes)}
        </p>
      ) : null}
    </Dialog>
  );
}

/** Corrects or removes a photo's caption (an empty caption removes it). */
function CaptionDialog({ photo, onClose }: { photo: InspectionPhoto | null; onClose: () => void }) {
  return (
    <Dialog
      visible={photo !== null}
      onHide={onClose}
      header="Edit caption"
      className="app-dialog"
      style={{ width: '30rem' }}
      breakpoints={{ '640px': 'calc(100vw - 1.5rem)' }}
      draggable={false}
      resizable={false}
    >
      {photo ? <CaptionForm key={photo.id} photo={photo} onClose={onClose} /> : null}
    </Dialog>
  );
}

function CaptionForm({ photo, onClose }: { photo: InspectionPhoto; onClose: () => void }) {
  const notify = useNotify();
  const update = useUpdatePhotoCaption();
  const [caption, setCaption] = useState(photo.caption ?? '');
  const [error, setError] = useState<string | null>(null);
  const [formError, setFormError] = useState<unknown>(null);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setFormError(null);
    try {
      const saved = await update.mutateAsync({ photo, caption: caption.trim() || null });
      notify.success(saved.caption ? 'Caption saved' : 'Caption removed', saved.caption ?? undefined);
      onClose();
    } catch (e) {
      const mapped = serverFormErrors(e, ['caption'] as const);
      setError(mapped.fields.caption ?? null);
      if (!mapped.fields.caption) setFormError(e);
    }
  };

  return (
    <form className="dialog-form" onSubmit={submit} noValidate>
      <FormField
        id="photo-caption-edit"
        label="Caption"
        error={error}
        hint="What and where: the crack, the wall, a landmark. Leave empty to remove the caption."
      >
        {({ invalid, ...control }) => (
          <InputText
            {...control}
            value={caption}
            onChange={(e) => {
              setCaption(e.target.value);
              setError(null);
            }}
            invalid={invalid}
            maxLength={PHOTO_CAPTION_MAX_LENGTH}
            autoFocus
            className="w-full"
          />
        )}
      </FormField>
      {formError ? <ApiErrorMessage error={formError} /> : null}
      <div className="dialog-actions">
        <Button type="button" label="Cancel" severity="secondary" outlined onClick={onClose} />
        <Button type="submit" label="Save caption" icon="pi pi-check" loading={update.isPending} />
      </div>
    </form>
  );
}

function UploadForm({ inspectionId }: { inspectionId: string }) {
  const notify = useNotify();
  const upload = useUploadPhoto();
  const inputRef = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [caption, setCaption] = useState('');
  const [progress, setProgress] = useState<number | null>(null);
  const [problem, setProblem] = useState<string | null>(null);

  const choose = (f: File | null) => {
    setProblem(null);
    upload.reset();
    // The server refuses the same (413); saying it here saves sending 15 MB over a phone connection.
    if (f && f.size > PHOTO_MAX_BYTES) {
      setFile(null);
      setProblem(`The file is larger than ${MB} MB. Send a smaller photo.`);
      if (inputRef.current) inputRef.current.value = '';
      return;
    }
    setFile(f);
  };

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    if (!file) {
      setProblem('Choose a photo first.');
      return;
    }
    setProgress(0);
    try {
      await upload.mutateAsync({
        inspectionId,
        file,
        caption,
        onProgress: (p) => setProgress(Math.round((p.loaded / p.total) * 100)),
      });
      notify.success('Photo uploaded', caption.trim() || file.name);
      setFile(null);
      setCaption('');
      if (inputRef.current) inputRef.current.value = '';
    } catch {
      // Shown below from upload.error: the server's words for 413 and 415.
    } finally {
      setProgress(null);
    }
  };

  return (
    <form className="photo-upload" onSubmit={submit} noValidate aria-label="Upload a photo">
      <div className="photo-upload__pick">
        <input
          ref={inputRef}
          id="photo-file"
          type="file"
          accept="image/*"
          capture="environment"
          className="visually-hidden photo-upload__input"
          onChange={(e) => choose(e.target.files?.[0] ?? null)}
        />
        <label htmlFor="photo-file" className="p-button p-button-outlined photo-upload__choose">
          <i className="pi pi-camera" aria-hidden="true" />
          <span>{file ? 'Choose another photo' : 'Choose photo'}</span>
        </label>
        <span className="photo-upload__file muted" aria-live="polite">
          {file ? `${file.name} · ${sizeText(file.size)}` : `JPEG, PNG, WebP or HEIC, up to ${MB} MB`}
        </span>
      </div>
      <div className="form-field photo-upload__caption">
        <label htmlFor="photo-caption" className="form-field__label">
          Caption
        </label>
        <InputText
          id="photo-caption"
          value={caption}
          onChange={(e) => setCaption(e.target.value)}
          maxLength={PHOTO_CAPTION_MAX_LENGTH}
          placeholder="Stair-step crack, east wall, by the hose bib"
          className="w-full"
        />
      </div>
      <Button
        type="submit"
        label="Upload photo"
        icon="pi pi-upload"
        loading={upload.isPending}
        disabled={!file}
        className="photo-upload__submit"
      />
      {progress !== null ? (
        <ProgressBar value={progress} className="photo-upload__progress" aria-label="Upload progress" />
      ) : null}
      {problem ? <p className="form-field__error photo-upload__problem">{problem}</p> : null}
      {upload.isError ? <ApiErrorMessage error={upload.error} className="photo-upload__problem" /> : null}
    </form>
  );
}
