import { byteSize } from '@/lib/format-figures';
import { useObjectStore } from '../api/get-object-store';

/** One line: how many uploaded files (location removed) the object store keeps, and their size. */
export function ObjectStoreLine() {
  const store = useObjectStore();
  if (store.isPending) return <p className="text-caption text-ink-soft">Reading the file store…</p>;
  if (store.isError) {
    return (
      <p role="alert" className="text-caption font-medium text-alert-800">
        File store: {store.error.message}
      </p>
    );
  }
  const { objects, bytes } = store.data;
  return (
    <p className="text-caption text-ink-soft">
      File store: {objects.toLocaleString('en-GB')} uploaded {objects === 1 ? 'file' : 'files'} kept, location removed ({byteSize(bytes)})
    </p>
  );
}
