import { useParams } from 'react-router-dom';
import { LifecycleBadge } from '@/components/ui/status-badge';
import { LoadingLine } from '@/components/ui/spinner';
import { isApiError } from '@/lib/api';
import { formatDateTime } from '@/lib/format';
import { useDocumentTitle } from '@/features/sketch/components/leave-guard';
import { ReadOnlySketch } from '@/features/review/components/read-only-sketch';
import { usePublicShare } from '../api/get-public-share';

function Brand() {
  return (
    <span className="flex items-center gap-2 text-base font-semibold tracking-wide text-white">
      <span aria-hidden className="inline-block h-3 w-3 rotate-45 border-2 border-copper-400" />
      Spoolwright
    </span>
  );
}

/** A full page saying why a link shows nothing (revoked, expired, unknown), never a sign-in. */
function LinkEndPage({ title, text, testId }: { title: string; text: string; testId: string }) {
  useDocumentTitle(`${title} · Spoolwright`);
  return (
    <div className="flex h-screen flex-col font-sans">
      <header className="flex h-11 shrink-0 items-center border-b border-steel-700 bg-steel-800 px-4">
        <Brand />
      </header>
      <main className="flex flex-1 items-start justify-center p-10">
        <div
          role="alert"
          data-testid={testId}
          className="max-w-lg rounded-lg border border-steel-300 bg-white p-6 shadow-sm"
        >
          <h1 className="mb-2 text-xl font-semibold text-steel-800">{title}</h1>
          <p className="text-sm text-steel-600">{text}</p>
          <p className="mt-3 text-sm text-steel-600">Ask the person who sent it for a new link.</p>
        </div>
      </main>
    </div>
  );
}

/** /share/:token — one spool revision, read-only, for anyone holding the link (no account). */
export function PublicSharePage() {
  const { token = '' } = useParams();
  const query = usePublicShare(token);
  const name = query.data?.spool.name;
  useDocumentTitle(name ? `${name} (shared) · Spoolwright` : 'Shared spool · Spoolwright');
  if (query.isPending) return <LoadingLine label="Opening the shared spool…" />;
  if (query.isError) {
    const e = query.error;
    if (isApiError(e) && e.status === 410) {
      const expired = /expired/i.test(e.message);
      return expired ? (
        <LinkEndPage
          testId="share-expired"
          title="This link has expired"
          text="The spool shared through this link is no longer available: the link's time ran out."
        />
      ) : (
        <LinkEndPage
          testId="share-revoked"
          title="This link was revoked"
          text="The person who shared this spool has withdrawn the link, so it shows nothing any more."
        />
      );
    }
    if (isApiError(e) && e.status === 404)
      return (
        <LinkEndPage
          testId="share-unknown"
          title="No such link"
          text="This address does not lead to a shared spool. Check that it was copied whole."
        />
      );
    return (
      <LinkEndPage
        testId="share-error"
        title="The shared spool could not be loaded"
        text={e.message}
      />
    );
  }
  const { spool, check, sharedAt, expiresAt, sharedBy } = query.data;
  const banner = (
    <div
      className="flex flex-wrap items-center gap-3 border-b border-steel-200 bg-steel-50 px-3 py-2 text-sm"
      data-testid="share-banner"
    >
      <h1 className="text-base font-semibold text-steel-900">{spool.name}</h1>
      {spool.line ? <span className="text-steel-600">line {spool.line}</span> : null}
      <span className="text-steel-600" data-testid="share-revision">
        revision {spool.revision}
      </span>
      <LifecycleBadge status={spool.status} />
      <span className="rounded bg-steel-700 px-1.5 py-px text-xs font-semibold uppercase tracking-wide text-white">
        Read-only
      </span>
      <span className="text-xs text-steel-600" data-testid="shared-by">
        Shared by {sharedBy ?? 'a team member'} on {formatDateTime(sharedAt)}, until{' '}
        {formatDateTime(expiresAt)}
      </span>
      <a
        className="ml-auto rounded border border-steel-300 bg-white px-2 py-0.5 text-xs font-medium text-copper-600 hover:bg-steel-100"
        href={`/api/share/${encodeURIComponent(token)}/calc-sheet.pdf`}
      >
        Download calc sheet (PDF)
      </a>
    </div>
  );
  return (
    <div className="flex h-screen flex-col font-sans">
      <header className="flex h-11 shrink-0 items-center gap-3 border-b border-steel-700 bg-steel-800 px-4 text-steel-100">
        <Brand />
        <span className="text-sm text-steel-300">shared spool</span>
      </header>
      <div className="min-h-0 flex-1">
        <ReadOnlySketch document={spool.document} check={check} banner={banner} />
      </div>
    </div>
  );
}
