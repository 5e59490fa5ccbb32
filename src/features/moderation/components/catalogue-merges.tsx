import type { QueryKey } from '@tanstack/react-query';
import { useState } from 'react';
import type { CatalogueEntryType } from '@shared/schemas/moderation';
import { useCurationCatalogue } from '../api/get-curation-catalogue';
import { ActionDone, ToolSection } from './curation-parts';
import { EntryPicker, type PickableEntry } from './entry-picker';
import { MergeForm } from './merge-form';
import { RenameForm } from './rename-form';

/** Rename or merge approved makers and recording devices (models and firmware are curated on their own pages). */
export function CatalogueMerges({ affects }: { affects: QueryKey[] }) {
  const catalogue = useCurationCatalogue();
  if (catalogue.isPending)
    return (
      <p className="text-ink-soft" role="status">
        Loading the catalogue…
      </p>
    );
  if (catalogue.isError)
    return (
      <p className="text-alert-800" role="alert">
        The catalogue could not be loaded: {catalogue.error.message}
      </p>
    );
  const modelsOf = (makerId: number) => catalogue.data.models.filter((m) => m.makerId === makerId).length;
  return (
    <div className="grid gap-6 lg:grid-cols-2">
      <EntryCuration
        type="maker"
        title="Makers"
        entries={catalogue.data.makers.map((m) => ({ id: m.id, name: m.name, hint: `${modelsOf(m.id)} models` }))}
        affects={affects}
      />
      <EntryCuration
        type="recording_device"
        title="Recording devices"
        entries={catalogue.data.recordingDevices.map((d) => ({ id: d.id, name: d.name, hint: d.kind.replace('_', ' ') }))}
        affects={affects}
      />
    </div>
  );
}

function EntryCuration({
  type,
  title,
  entries,
  affects,
}: {
  type: CatalogueEntryType;
  title: string;
  entries: PickableEntry[];
  affects: QueryKey[];
}) {
  const [chosenId, setChosenId] = useState<number | null>(null);
  const [merged, setMerged] = useState<string | null>(null);
  const chosen = entries.find((e) => e.id === chosenId);
  const noun = title.toLowerCase().replace(/s$/, '');
  return (
    <section aria-label={title} className="space-y-4 rounded-card border border-paper-line bg-white p-5 shadow-card">
      <h3 className="text-lead font-semibold text-ink">{title}</h3>
      {merged && <ActionDone>{merged}</ActionDone>}
      <EntryPicker
        label={`The ${noun} to rename or merge away`}
        entries={entries}
        value={chosenId}
        onChange={(id) => {
          setChosenId(id);
          setMerged(null);
        }}
      />
      {chosen ? (
        <div key={chosen.id}>
          <ToolSection title={`Rename “${chosen.name}”`}>
            <RenameForm type={type} entry={chosen} affects={affects} label={`New ${noun} name`} />
          </ToolSection>
          <ToolSection title={`Merge “${chosen.name}” into another ${noun}`}>
            <MergeForm
              type={type}
              from={chosen}
              targets={entries}
              targetLabel={`The ${noun} to keep`}
              affects={affects}
              onMerged={(into, result) => {
                setMerged(
                  `Merged “${chosen.name}” into “${into.name}”: ${result.movedRecordings} recordings moved; the old name stays as an alias.`,
                );
                setChosenId(null);
              }}
            />
          </ToolSection>
        </div>
      ) : (
        <p className="text-caption text-ink-soft">Choose a {noun} first.</p>
      )}
    </section>
  );
}
