import type { KitPhoto } from '@revloop/contract';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
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
        <label className="mt-3 flex flex-col gap-1 text-sm font-medium text-ink-900">
          Add a photo (JPEG, PNG or WebP, up to 10 MiB)
          <input
            type="file"
            accept="image/jpeg,image/png,image/webp"
            disabled={add.isPending}
            onChange={(e) => {
              const file = e.target.files?.[0];
              if (file) add.mutate({ kitId, file });
              e.target.value = '';
            }}
          />
        </label>
      )}
    </Card>
  );
}
