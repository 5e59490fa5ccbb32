import type { QueryKey } from '@tanstack/react-query';
import { useNavigate } from 'react-router-dom';
import { useCurationCatalogue } from '../api/get-curation-catalogue';
import { ModeratorPanel, ToolSection, mergedNotice } from './curation-parts';
import { BatteryClaimForm } from './battery-claim-form';
import { CuratorOnly } from './curator-only';
import { MergeForm } from './merge-form';
import { NoteEditor } from './note-editor';
import { RenameForm } from './rename-form';
import { ScoreboardVisibilityForm } from './scoreboard-visibility-form';

interface ModelToolsProps {
  modelSlug: string;
  note: string | null;
  hiddenReason: string | null;
  /** The maker's battery claim as the page shows it. */
  batteryClaim: { hours: number; source: string } | null;
  /** Query keys of what these tools change: the model page and the scoreboard. */
  affects: QueryKey[];
  /** The query key of the model's battery figures, which the claim changes. */
  batteryAffects: QueryKey[];
}

/** The model page's curation tools: pinned note, scoreboard visibility, rename, merge into another model of the same maker. */
export function ModeratorModelTools(props: ModelToolsProps) {
  return (
    <CuratorOnly>
      <ModelTools {...props} />
    </CuratorOnly>
  );
}

function ModelTools({ modelSlug, note, hiddenReason, affects, batteryClaim, batteryAffects }: ModelToolsProps) {
  const navigate = useNavigate();
  const catalogue = useCurationCatalogue();
  if (catalogue.isPending)
    return (
      <ModeratorPanel title="Curate this model">
        <p role="status" className="text-ink-soft">
          Loading the catalogue…
        </p>
      </ModeratorPanel>
    );
  if (catalogue.isError)
    return (
      <ModeratorPanel title="Curate this model">
        <p role="alert" className="text-alert-800">
          The catalogue could not be loaded: {catalogue.error.message}
        </p>
      </ModeratorPanel>
    );
  const model = catalogue.data.models.find((m) => m.slug === modelSlug);
  if (!model) return null;
  const maker = catalogue.data.makers.find((m) => m.id === model.makerId);
  const siblings = catalogue.data.models.filter((m) => m.makerId === model.makerId && m.id !== model.id);
  return (
    <ModeratorPanel title="Curate this model">
      <ToolSection title="Pinned note" summary={note ? `“${note}”` : 'none'}>
        <NoteEditor subject="model" id={model.id} current={note} affects={affects} />
      </ToolSection>
      <ToolSection title="Scoreboard" summary={hiddenReason ? 'hidden' : 'listed'}>
        <ScoreboardVisibilityForm modelId={model.id} hiddenReason={hiddenReason} affects={affects} />
      </ToolSection>
      <ToolSection title="Maker's battery claim" summary={batteryClaim ? `${batteryClaim.hours} h` : 'none'}>
        <BatteryClaimForm
          key={batteryClaim ? `${batteryClaim.hours}|${batteryClaim.source}` : 'none'}
          modelId={model.id}
          current={batteryClaim}
          affects={batteryAffects}
        />
      </ToolSection>
      <ToolSection title="Rename">
        <RenameForm type="model" entry={model} affects={affects} label="New model name" />
      </ToolSection>
      <ToolSection title="Merge into another model" summary={`of ${maker?.name ?? 'the same maker'}`}>
        <MergeForm
          type="model"
          from={model}
          targets={siblings.map((m) => ({ id: m.id, name: m.name, hint: m.slug }))}
          targetLabel={`The ${maker?.name ?? ''} model to keep`}
          affects={affects}
          onMerged={(into, result) =>
            navigate(
              `/models/${siblings.find((m) => m.id === into.id)!.slug}`,
              mergedNotice(
                `“${model.name}” was merged into this model: ${result.movedRecordings} recordings moved. The old name stays as an alias.`,
              ),
            )
          }
        />
      </ToolSection>
    </ModeratorPanel>
  );
}
