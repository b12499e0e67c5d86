export function LoadingLine({ label = 'Loading…' }: { readonly label?: string }) {
  return (
    <p role="status" className="p-4 text-sm text-steel-500">
      {label}
    </p>
  );
}

export function ErrorLine({ error }: { readonly error: unknown }) {
  const message = error instanceof Error ? error.message : String(error);
  return (
    <p role="alert" className="rounded border border-red-300 bg-red-50 p-3 text-sm text-red-800">
      {message}
    </p>
  );
}
