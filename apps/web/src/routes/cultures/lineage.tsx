import { useEffect, useMemo, useRef, useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router';
import { useQuery } from '@tanstack/react-query';
import { stratify, tree, type HierarchyNode, type HierarchyPointNode } from 'd3-hierarchy';
import type { LineageNodeDto } from '@barmkeep/schemas';
import { cultureQueries } from '../../api/cultures/queries';
import { Button, Loading, Notice, PageHeader } from '../../components';
import { stateLabels } from '../../lib/cultureLabels';

const ROW = 46;
const COL = 210;
const NODE_W = 180;
const NODE_H = 38;
/** Past this many nodes, branches start collapsed (except the path to the culture you came from). */
export const COLLAPSE_ABOVE = 200;

function initialCollapsed(root: HierarchyNode<LineageNodeDto>, focusId: string): Set<string> {
  const collapsed = new Set<string>();
  if (root.descendants().length <= COLLAPSE_ABOVE) return collapsed;
  const keepOpen = new Set(
    root
      .find((n) => n.data.id === focusId)
      ?.ancestors()
      .map((a) => a.data.id) ?? [],
  );
  // open the first two levels, then fold every branch off the path to the focus
  root.each((n) => {
    if (n.depth >= 2 && n.children && !keepOpen.has(n.data.id)) collapsed.add(n.data.id);
  });
  return collapsed;
}

export function Component() {
  const { id = '' } = useParams();
  const navigate = useNavigate();
  const { data, isError, error } = useQuery(cultureQueries.lineage(id));

  const root = useMemo(() => {
    if (!data) return null;
    return stratify<LineageNodeDto>()
      .id((d) => d.id)
      .parentId((d) => d.parentId)(data.nodes);
  }, [data]);
  const [collapsed, setCollapsed] = useState<Set<string> | null>(null);
  const folded = useMemo(
    () => collapsed ?? (root && data ? initialCollapsed(root, data.focusId) : new Set<string>()),
    [collapsed, root, data],
  );

  const layout = useMemo(() => {
    if (!root) return null;
    const visible = root.copy();
    // copy() keeps the data but not the stratify ids: fold by data id
    visible.each((n) => {
      if (folded.has(n.data.id)) {
        (n as HierarchyNode<LineageNodeDto> & { hidden?: number }).hidden = n.descendants().length - 1;
        n.children = undefined;
      }
    });
    const laid = tree<LineageNodeDto>().nodeSize([ROW, COL])(visible);
    let minX = Infinity;
    let maxX = -Infinity;
    let maxY = 0;
    laid.each((n) => {
      minX = Math.min(minX, n.x);
      maxX = Math.max(maxX, n.x);
      maxY = Math.max(maxY, n.y);
    });
    return { laid, minX, height: maxX - minX + ROW * 2, width: maxY + NODE_W + 40 };
  }, [root, folded]);

  // bring the culture you came from into view
  const scroller = useRef<HTMLDivElement>(null);
  const focusPoint = useMemo(() => {
    if (!layout || !data) return null;
    const f = layout.laid.find((n) => n.data.id === data.focusId);
    return f ? { top: f.x - layout.minX + ROW, left: f.y } : null;
  }, [layout, data]);
  useEffect(() => {
    const el = scroller.current;
    if (!el || !focusPoint) return;
    el.scrollTop = Math.max(0, focusPoint.top - el.clientHeight / 2);
    el.scrollLeft = Math.max(0, focusPoint.left - el.clientWidth / 3);
  }, [focusPoint]);

  if (isError)
    return (
      <Notice tone="danger" title="Could not load the lineage">
        {error.message}
      </Notice>
    );
  if (!data || !layout || !root) return <Loading label="Tracing the lineage…" />;

  const toggle = (nodeId: string) => {
    const next = new Set(folded);
    if (next.has(nodeId)) next.delete(nodeId);
    else next.add(nodeId);
    setCollapsed(next);
  };
  const nodes = layout.laid.descendants() as (HierarchyPointNode<LineageNodeDto> & { hidden?: number })[];
  const focus = data.nodes.find((n) => n.id === data.focusId);

  return (
    <>
      <title>Lineage · Barmkeep</title>
      <PageHeader
        title="Lineage"
        description={`${data.nodes.length} cultures from the founding one down${focus?.strainName ? `, around ${focus.strainName}` : ''}.`}
        actions={
          <>
            <Button variant="secondary" onClick={() => setCollapsed(new Set())}>
              Open all
            </Button>
            <Link
              to={`/cultures/${data.focusId}`}
              className="inline-flex min-h-11 items-center px-2 text-accent underline"
            >
              Back to the culture
            </Link>
          </>
        }
      />
      <p className="mb-3 text-sm text-ink-muted">
        Each box: name, generation and state. A red edge marks a suspect or quarantined culture. Tap a box to open it;
        tap “+n” to unfold a branch.
      </p>
      <div
        ref={scroller}
        className="overflow-auto rounded-lg border border-rule bg-paper-raised"
        style={{ maxHeight: '70vh' }}
      >
        <svg width={layout.width} height={layout.height} role="tree" aria-label="Lineage tree">
          <g transform={`translate(10, ${-layout.minX + ROW})`}>
            {layout.laid.links().map((l) => (
              <path
                key={`${l.source.id}-${l.target.id}`}
                d={`M${l.source.y + NODE_W},${l.source.x} C${l.source.y + NODE_W + 10},${l.source.x} ${l.target.y - 10},${l.target.x} ${l.target.y},${l.target.x}`}
                fill="none"
                stroke="var(--color-rule-strong)"
              />
            ))}
            {nodes.map((n) => {
              const d = n.data;
              const isFocus = d.id === data.focusId;
              const danger = d.suspect || d.state === 'quarantined';
              return (
                <g
                  key={d.id}
                  transform={`translate(${n.y}, ${n.x - NODE_H / 2})`}
                  role="treeitem"
                  aria-level={n.depth + 1}
                  aria-selected={isFocus}
                >
                  {d.visible && !d.openable ? (
                    <PathNode d={d} danger={danger} isFocus={isFocus} />
                  ) : d.visible ? (
                    <a
                      href={`/cultures/${d.id}`}
                      onClick={(e) => {
                        e.preventDefault();
                        navigate(`/cultures/${d.id}`);
                      }}
                    >
                      <rect
                        width={NODE_W}
                        height={NODE_H}
                        rx={5}
                        fill={isFocus ? 'var(--color-accent-soft)' : 'var(--color-paper)'}
                        stroke={
                          danger ? 'var(--color-danger)' : isFocus ? 'var(--color-accent)' : 'var(--color-rule-strong)'
                        }
                        strokeWidth={danger || isFocus ? 2 : 1}
                      />
                      <text x={7} y={15} fontSize={12} fontWeight={600} fill="var(--color-ink)">
                        {(d.strainName ?? '').slice(0, 24)}
                        {(d.strainName ?? '').length > 24 ? '…' : ''}
                      </text>
                      <text x={7} y={30} fontSize={11} fill={danger ? 'var(--color-danger)' : 'var(--color-ink-muted)'}>
                        gen {d.generation} · {d.state ? stateLabels[d.state] : ''}
                        {d.clubStock ? ' · club stock' : ''}
                        {d.suspect ? ' · suspect' : ''}
                      </text>
                      <title>{`${d.strainName} — generation ${d.generation}, ${d.state ? stateLabels[d.state] : ''}${d.owner ? `, kept by ${d.owner.name}` : ''}${d.clubStock ? ' for the club' : ''}${d.suspect ? ', suspect' : ''}`}</title>
                    </a>
                  ) : (
                    <>
                      <rect
                        width={NODE_W}
                        height={NODE_H}
                        rx={5}
                        fill="var(--color-paper-sunk)"
                        stroke="var(--color-rule)"
                      />
                      <text x={7} y={23} fontSize={12} fill="var(--color-ink-faint)">
                        not shared with you
                      </text>
                    </>
                  )}
                  {n.hidden ? (
                    <g
                      transform={`translate(${NODE_W + 4}, 9)`}
                      className="cursor-pointer"
                      onClick={() => toggle(d.id)}
                      role="button"
                      aria-label={`Unfold ${n.hidden} below`}
                    >
                      <rect
                        width={36}
                        height={20}
                        rx={10}
                        fill="var(--color-paper-sunk)"
                        stroke="var(--color-rule-strong)"
                      />
                      <text x={18} y={14} fontSize={11} textAnchor="middle" fill="var(--color-ink)">
                        +{n.hidden}
                      </text>
                    </g>
                  ) : null}
                </g>
              );
            })}
          </g>
        </svg>
      </div>
      <KeepersOf nodes={data.nodes} />
    </>
  );
}

/** A fellow club member's culture: its place in the strain's path and its keeper, not a link. */
function PathNode({ d, danger, isFocus }: { d: LineageNodeDto; danger: boolean; isFocus: boolean }) {
  const keeper = d.owner?.name ?? 'another member';
  return (
    <g>
      <rect
        width={NODE_W}
        height={NODE_H}
        rx={5}
        fill="var(--color-paper-raised)"
        stroke={danger ? 'var(--color-danger)' : isFocus ? 'var(--color-accent)' : 'var(--color-rule-strong)'}
        strokeWidth={danger || isFocus ? 2 : 1}
        strokeDasharray="4 3"
      />
      <text x={7} y={15} fontSize={12} fontWeight={600} fill="var(--color-ink)">
        {(d.strainName ?? '').slice(0, 24)}
        {(d.strainName ?? '').length > 24 ? '…' : ''}
      </text>
      <text x={7} y={30} fontSize={11} fill={danger ? 'var(--color-danger)' : 'var(--color-ink-muted)'}>
        gen {d.generation} · {d.clubStock ? 'club stock' : keeper.slice(0, 18)}
        {d.suspect ? ' · suspect' : ''}
      </text>
      <title>{`${d.strainName} — generation ${d.generation}, kept by ${keeper}${d.suspect ? ', suspect' : ''}. Only its keeper can open it.`}</title>
    </g>
  );
}

/** Who keeps the cultures in this tree, in words (the boxes show it only on hover). */
function KeepersOf({ nodes }: { nodes: LineageNodeDto[] }) {
  const counts = new Map<string, { name: string; n: number }>();
  let hidden = 0;
  for (const n of nodes) {
    if (!n.visible || !n.owner) {
      hidden += n.visible ? 0 : 1;
      continue;
    }
    const c = counts.get(n.owner.id) ?? { name: n.owner.name, n: 0 };
    c.n += 1;
    counts.set(n.owner.id, c);
  }
  if (counts.size < 2 && hidden === 0) return null;
  return (
    <section aria-label="Keepers in this lineage" className="mt-3 text-sm">
      <h2 className="font-semibold">Kept by</h2>
      <ul className="mt-1 flex flex-wrap gap-x-4 gap-y-1">
        {[...counts].map(([id, c]) => (
          <li key={id}>
            {c.name} <span className="num text-ink-muted">({c.n})</span>
          </li>
        ))}
        {hidden ? (
          <li className="text-ink-muted">
            people you share no club with <span className="num">({hidden})</span>
          </li>
        ) : null}
      </ul>
      <p className="mt-1 text-ink-muted">
        Dashed boxes are fellow club members’ cultures: you see the strain’s path and who keeps it; their notes and
        photos stay theirs.
      </p>
    </section>
  );
}
