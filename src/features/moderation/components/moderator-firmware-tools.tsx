import type { QueryKey } from '@tanstack/react-query';
import { useNavigate } from 'react-router-dom';
import { useCurationCatalogue } from '../api/get-curation-catalogue';
import { ModeratorPanel, ToolSection, mergedNotice } from './curation-parts';
import { CuratorOnly } from './curator-only';
import { MergeForm } from './merge-form';
import { NoteEditor } from './note-editor';

interface FirmwareToolsProps {
  modelSlug: string;
  version: string;
  note: string | null;
  /** Query keys of what these tools change: the model's pages and the scoreboard. */
  affects: QueryKey[];
}

/** The firmware page's curation tools: pinned note, merge into another version of the same model. */
export function ModeratorFirmwareTools(props: FirmwareToolsProps) {
  return (
    <CuratorOnly>
      <FirmwareTools {...props} />
    </CuratorOnly>
  );
}

function FirmwareTools({ modelSlug, version, note, affects }: FirmwareToolsProps) {
  const navigate = useNavigate();
  const catalogue = useCurationCatalogue();
  if (catalogue.isPending)
    return (
      <ModeratorPanel title="Curate this firmware version">
        <p role="status" className="text-ink-soft">
          Loading the catalogue…
        </p>
      </ModeratorPanel>
    );
  if (catalogue.isError)
    return (
      <ModeratorPanel title="Curate this firmware version">
        <p role="alert" className="text-alert-800">
          The catalogue could not be loaded: {catalogue.error.message}
        </p>
      </ModeratorPanel>
    );
  const model = catalogue.data.models.find((m) => m.slug === modelSlug);
  const versions = catalogue.data.firmware.filter((f) => f.modelId === model?.id);
  const firmware = versions.find((f) => f.version === version);
  if (!model || !firmware) return null;
  return (
    <ModeratorPanel title="Curate this firmware version">
      <ToolSection title="Pinned note" summary={note ? `“${note}”` : 'none'}>
        <NoteEditor subject="firmware" id={firmware.id} current={note} affects={affects} />
      </ToolSection>
      <ToolSection title="Merge into another version" summary={`of ${model.name}`}>
        <MergeForm
          type="firmware"
          from={{ id: firmware.id, name: firmware.version }}
          targets={versions
            .filter((f) => f.id !== firmware.id)
            .map((f) => ({
              id: f.id,
              name: f.version,
              hint: [f.beta && 'beta', f.releasedOn && `released ${f.releasedOn}`].filter(Boolean).join(', '),
            }))}
          targetLabel={`The ${model.name} version to keep`}
          affects={affects}
          onMerged={(into, result) =>
            navigate(
              `/models/${model.slug}/firmware/${encodeURIComponent(into.name)}`,
              mergedNotice(
                `Firmware ${firmware.version} was merged into this version: ${result.movedRecordings} recordings moved. The old version stays as an alias.`,
              ),
            )
          }
        />
      </ToolSection>
    </ModeratorPanel>
  );
}
