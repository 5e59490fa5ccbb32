export function PageSection({ title, intro, children }: { title: string; intro?: string; children: React.ReactNode }) {
  return (
    <section className="mt-12">
      <h2 className="text-lead font-semibold text-ink">{title}</h2>
      {intro && <p className="mt-1 max-w-3xl text-ink-soft">{intro}</p>}
      <div className="mt-4">{children}</div>
    </section>
  );
}
