import {
  createContext,
  useContext,
  useMemo,
  useRef,
  type MutableRefObject,
  type ReactNode,
} from 'react';

/*
 * Review badges over the sketch: a count of open comments on each commented element. Like the
 * dimension labels they are plain DOM nodes in an overlay, moved to the projected mid-point of
 * their element after every rendered frame, so they follow orbit, pan and zoom (and work with
 * software WebGL: no extra render target or React root per badge).
 */

export interface CommentBadgeValue {
  /** Open comments per element id (elements without any are absent). */
  readonly counts: ReadonlyMap<string, number>;
  /** A badge was clicked: select the element and open its thread. */
  readonly onOpen: (elementId: string) => void;
}

/** Screen point of an element's badge anchor, or null when it is not drawn. */
type Projector = (elementId: string) => { x: number; y: number } | null;

interface Shared extends CommentBadgeValue {
  readonly registry: MutableRefObject<Map<string, HTMLButtonElement>>;
  /** Move every badge to its projected point (called from the canvas after each frame). */
  readonly place: (project: Projector) => void;
}

const OFF = 'translate(-10000px, 0)';

/** Read by the canvas side (comment-badges.tsx); kept here so pages import no three.js. */
export const BadgeContext = createContext<Shared | null>(null);

/** Supplies the counts to the canvas; without it the canvas draws no badges. */
export function CommentBadgesProvider({
  counts,
  onOpen,
  children,
}: CommentBadgeValue & { readonly children: ReactNode }) {
  const registry = useRef(new Map<string, HTMLButtonElement>());
  const value = useMemo(() => {
    const place = (project: Projector) => {
      for (const [id, el] of registry.current) {
        const p = project(id);
        // Just above and right of the element's centre, so a click on the pipe itself still reaches it.
        el.style.transform = p
          ? `translate(${(p.x + 6).toFixed(1)}px, ${(p.y - 26).toFixed(1)}px)`
          : OFF;
      }
    };
    return { counts, onOpen, registry, place };
  }, [counts, onOpen]);
  return <BadgeContext.Provider value={value}>{children}</BadgeContext.Provider>;
}

/** The DOM side, beside the `<Canvas>`: one button per commented element, parked off-screen until projected. */
export function CommentBadgeOverlay() {
  const ctx = useContext(BadgeContext);
  if (!ctx || ctx.counts.size === 0) return null;
  const { counts, onOpen, registry } = ctx;
  return (
    <div
      className="pointer-events-none absolute inset-0 overflow-hidden font-sans"
      data-testid="comment-badges"
    >
      {[...counts].map(([id, n]) => (
        <button
          key={id}
          type="button"
          ref={(el) => {
            if (el) registry.current.set(id, el);
            else registry.current.delete(id);
          }}
          data-testid={`comment-badge-${id}`}
          aria-label={`${n} open comment${n === 1 ? '' : 's'} on ${id}`}
          title={`${n} open comment${n === 1 ? '' : 's'} on ${id}: open the thread`}
          onClick={() => onOpen(id)}
          className="pointer-events-auto absolute top-0 left-0 flex h-5 min-w-5 items-center justify-center gap-0.5 rounded-full border border-white bg-violet-700 px-1.5 text-[11px] font-semibold leading-none text-white shadow hover:bg-violet-800"
          style={{ transform: OFF }}
        >
          <span aria-hidden>✎</span>
          {n}
        </button>
      ))}
    </div>
  );
}
