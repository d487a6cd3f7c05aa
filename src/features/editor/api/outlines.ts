import { countTearRisks } from '@shared/sheet/preflight';
import { useQueries } from '@tanstack/react-query';
import { useEffect, useMemo, useRef, useState } from 'react';
import type { OutlineResponse } from '@shared/schemas/outline';
import type { Piece } from '@shared/sheet/document';
import { api } from '@/lib/api-client';
import type { PieceOutline as SharedPieceOutline } from '@shared/sheet/placement';
import { outlineKey } from '@shared/sheet/placement';
import type { CutLimits } from '@shared/sheet/outline-request';

/** A piece's outline as the editor holds it: the cut line (shared/'s PieceOutline) and what it shows. */
export type PieceOutline = SharedPieceOutline & {
  svgPath: string;
  areaMm2: number;
  pngUrl: string;
  effectiveDpi: number;
  narrowNecks: number;
};

function fetchOutline(teamId: string, key: string): Promise<PieceOutline> {
  const [artId, search] = key.split('?');
  return api<OutlineResponse>('GET', `/teams/${teamId}/art/${artId}/outline?${search}`).then((r) => ({
    points: r.pieces[0].cutLine.points,
    svgPath: r.pieces[0].cutLine.svgPath,
    widthMm: r.pieces[0].widthMm,
    heightMm: r.pieces[0].heightMm,
    areaMm2: r.pieces[0].areaMm2,
    pngUrl: r.pieces[0].pngUrl,
    effectiveDpi: r.effectiveDpi,
    narrowNecks: countTearRisks(r.warnings),
  }));
}

/**
 * Outlines for every piece. Size and border changes are debounced, so typing a width or dragging a
 * handle never sends a request per frame; until the new outline arrives a piece keeps its last one
 * and is marked pending.
 */
export function usePieceOutlines(teamId: string, pieces: Piece[], { minFeatureMm, bridgeWidthMm }: CutLimits) {
  const wanted = useMemo(
    () => new Map(pieces.map((p) => [p.id, outlineKey(p, { minFeatureMm, bridgeWidthMm })])),
    [pieces, minFeatureMm, bridgeWidthMm],
  );
  const [settled, setSettled] = useState(wanted);
  useEffect(() => {
    const handle = setTimeout(() => setSettled(wanted), 250);
    return () => clearTimeout(handle);
  }, [wanted]);
  const keys = useMemo(() => [...new Set(settled.values())], [settled]);
  const results = useQueries({
    queries: keys.map((key) => ({
      queryKey: ['teams', teamId, 'outline', key],
      queryFn: () => fetchOutline(teamId, key),
      staleTime: Infinity,
      retry: 1,
    })),
  });
  const byKey = new Map<string, PieceOutline>();
  keys.forEach((key, i) => results[i].data && byKey.set(key, results[i].data!));
  const errors = keys.filter((_k, i) => results[i].isError);
  const lastGood = useRef(new Map<string, PieceOutline>());
  const outlines = new Map<string, { outline: PieceOutline | undefined; pending: boolean }>();
  for (const piece of pieces) {
    const current = byKey.get(wanted.get(piece.id)!);
    if (current) lastGood.current.set(piece.id, current);
    outlines.set(piece.id, { outline: current ?? lastGood.current.get(piece.id), pending: !current });
  }
  return { outlines, errors };
}
