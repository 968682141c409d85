import { useEffect, useState } from 'react';
import { Skeleton } from 'primereact/skeleton';
import type { JobPhoto } from '@loambook/common';
import { usePhotoBlob } from '@/features/inspections/api/get-photos';
import { formatRecent } from '@/lib/format';

function useObjectUrl(blob: Blob | undefined): string | null {
  const [url, setUrl] = useState<string | null>(null);
  useEffect(() => {
    if (!blob || typeof URL.createObjectURL !== 'function') return;
    const made = URL.createObjectURL(blob);
    setUrl(made);
    return () => {
      URL.revokeObjectURL(made);
      setUrl(null);
    };
  }, [blob]);
  return url;
}

function Thumb({ photo }: { photo: JobPhoto }) {
  const blob = usePhotoBlob(photo.thumbnailUrl ?? photo.url);
  const url = useObjectUrl(blob.data);
  if (blob.isError) {
    return (
      <span className="job-photo__placeholder">
        <i className="pi pi-image" aria-hidden="true" /> No preview
      </span>
    );
  }
  return url ? (
    <img src={url} alt={photo.caption ?? 'Site photo'} className="job-photo__img" />
  ) : (
    <Skeleton height="100%" />
  );
}

/** The crew's photos from the site, each with the point or pier it shows. */
export function JobPhotos({ photos }: { photos: JobPhoto[] }) {
  if (!photos.length) return <p className="muted">No photos from the site yet.</p>;
  return (
    <ul className="job-photos" aria-label="Site photos">
      {photos.map((p) => (
        <li key={p.id} className="job-photo">
          <span className="job-photo__frame">
            <Thumb photo={p} />
          </span>
          <span className="job-photo__caption">{p.caption ?? 'Photo'}</span>
          <span className="muted job-photo__when">{formatRecent(p.createdAt)}</span>
        </li>
      ))}
    </ul>
  );
}
