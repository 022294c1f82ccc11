import { Link } from 'react-router';

export function NotFoundPage() {
  return (
    <section className="max-w-xl">
      <h1 className="text-2xl font-semibold">No such page</h1>
      <p className="mt-2 text-graphite-soft">
        The address does not match a console page. <Link className="text-copper underline" to="/">Back to the overview</Link>.
      </p>
    </section>
  );
}
