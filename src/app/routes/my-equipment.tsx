import { RequireAccess } from '@/features/auth/components/require-access';
import { useMyMeters } from '@/features/equipment/api/get-my-meters';
import { AddMeterForm } from '@/features/equipment/components/add-meter-form';
import { MeterCard } from '@/features/equipment/components/meter-card';
import { useCatalogue } from '@/features/submissions/api/get-catalogue';

function Equipment() {
  const meters = useMyMeters();
  const catalogue = useCatalogue();
  if (meters.isPending || catalogue.isPending)
    return (
      <p className="text-ink-soft" role="status">
        Loading your meters…
      </p>
    );
  if (meters.isError)
    return (
      <p role="alert" className="text-alert-800">
        {meters.error.message}
      </p>
    );
  if (catalogue.isError)
    return (
      <p role="alert" className="text-alert-800">
        {catalogue.error.message}
      </p>
    );
  const approved = { makers: catalogue.data.makers, models: catalogue.data.models.filter((m) => m.status === 'approved') };
  const firmwareOf = (modelId: number) => catalogue.data.firmware.filter((f) => f.modelId === modelId && f.status === 'approved');
  return (
    <div className="space-y-6">
      {meters.data.meters.map((meter) => (
        <MeterCard key={meter.id} meter={meter} firmware={firmwareOf(meter.model.id)} />
      ))}
      <section
        aria-labelledby="add-meter"
        className="space-y-4 rounded-card border border-dashed border-paper-line bg-paper-deep/40 p-5 sm:p-6"
      >
        <h2 id="add-meter" className="text-lead font-semibold text-ink">
          {meters.data.meters.length === 0 ? 'Add your first meter' : 'Add another meter'}
        </h2>
        <AddMeterForm catalogue={approved} />
      </section>
    </div>
  );
}

export function MyEquipmentRoute() {
  return (
    <RequireAccess>
      {() => (
        <div className="max-w-4xl space-y-6">
          <header className="space-y-1">
            <p className="text-caption font-semibold uppercase tracking-widest text-ember-700">Your equipment</p>
            <h1 className="text-title font-semibold text-ink">My meters and their batteries</h1>
            <p className="max-w-3xl text-ink-soft">
              Log each battery change or recharge and why the battery before came out. Your submitted rides with the meter count towards the
              battery of their day; add other riding by hand. Batteries still running count too, as "at least this long", in the
              battery-life figures of the model and its firmware.
            </p>
          </header>
          <Equipment />
        </div>
      )}
    </RequireAccess>
  );
}
