import type { KitPhoto } from '@revloop/contract';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { Field } from '../../../components/ui/field';
import { errorMessage } from '../../../lib/form-errors';
import { useAddKitPhoto } from '../api/add-kit-photo';
import { useDeleteKitPhoto } from '../api/delete-kit-photo';

/** The kit's photos (optional); owners add JPEG, PNG or WebP images and delete them. */
export function KitPhotos({ kitId, photos, canEdit }: { kitId: string; photos: KitPhoto[]; canEdit: boolean }) {
  const add = useAddKitPhoto();
  const remove = useDeleteKitPhoto();
  const error = add.error ?? remove.error;
  return (
    <Card title="Photos">
      {error && <Banner tone="bad">{errorMessage(error)}</Banner>}
      {photos.length === 0 ? (
        <p className="text-sm text-ink-600">No photos of this kit yet.</p>
      ) : (
        <ul className="grid grid-cols-2 gap-3 sm:grid-cols-4">
          {photos.map((p) => (
            <li key={p.id} className="flex flex-col gap-1">
              <img src={p.url} alt={`Kit photo ${p.originalName}`} className="aspect-square w-full rounded object-cover" loading="lazy" />
              {canEdit && (
                <Button
                  variant="ghost"
                  size="sm"
                  aria-label={`Delete photo ${p.originalName}`}
                  pending={remove.isPending && remove.variables?.photoId === p.id}
                  onClick={() => remove.mutate({ kitId, photoId: p.id })}
                >
                  Delete photo
                </Button>
              )}
            </li>
          ))}
        </ul>
      )}
      {canEdit && (
        <div className="mt-4">
          <Field id="kit-photo-file" label="Add a photo" hint="JPEG, PNG or WebP, up to 10 MiB; it is added as soon as you choose it.">
            {(a11y) => (
              <input
                {...a11y}
                type="file"
                accept="image/jpeg,image/png,image/webp"
                disabled={add.isPending}
                className="block w-full text-sm text-ink-800 file:mr-3 file:rounded-lg file:border file:border-ink-300 file:bg-white file:px-3 file:py-2 file:text-sm file:font-medium hover:file:bg-ink-100 disabled:opacity-60"
                onChange={(e) => {
                  const file = e.target.files?.[0];
                  if (file) add.mutate({ kitId, file });
                  e.target.value = '';
                }}
              />
            )}
          </Field>
          {add.isPending && (
            <p role="status" className="mt-2 text-sm text-ink-600">
              Uploading the photo…
            </p>
          )}
        </div>
      )}
    </Card>
  );
}
