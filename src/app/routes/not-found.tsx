import { Link } from 'react-router-dom';

export default function NotFoundRoute() {
  return (
    <div className="max-w-lg">
      <h1 className="text-lg font-semibold">Page not found</h1>
      <p className="mt-2 text-sm text-ink-600">
        The address does not match any page. <Link to="/" className="text-copper-600 underline">Go to Home</Link>.
      </p>
    </div>
  );
}
