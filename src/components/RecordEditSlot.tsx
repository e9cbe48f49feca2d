// Embeds the curation team's RecordEditForm when it is part of the build; the
// glob is resolved at build time, so a missing form simply shows nothing.
import { lazy, Suspense, useState, type ComponentType } from 'react';

const found = import.meta.glob('./RecordEditForm.tsx') as Record<string, () => Promise<{ default: ComponentType<any> }>>;
const loader = found['./RecordEditForm.tsx'];
const Form = loader ? lazy(loader) : null;

export default function RecordEditSlot(props: Record<string, unknown>) {
  const [open, setOpen] = useState(false);
  if (!Form) return null;
  return (
    <div data-testid="record-edit">
      <button type="button" className="btn-quiet" aria-expanded={open} onClick={() => setOpen((o) => !o)}>
        {open ? 'Close the editor' : 'Edit record'}
      </button>
      {open && (
        <div className="mt-3">
          <Suspense fallback={<div className="skeleton h-40" role="status">Loading the editor…</div>}>
            <Form {...props} />
          </Suspense>
        </div>
      )}
    </div>
  );
}
