import { Link } from 'react-router-dom';

export default function NotFound() {
  return (
    <div className="max-w-lg">
      <h1 className="text-lg font-semibold text-ink-950">No such page</h1>
      <p className="mt-2 text-sm text-ink-500">The address does not match any page of Cellwright.</p>
      <Link to="/" className="mt-4 inline-block text-sm font-medium text-copper-700 underline">Back to home</Link>
    </div>
  );
}
