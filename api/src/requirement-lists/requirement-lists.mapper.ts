import { normaliseKeyName } from '@stavemark/shared';
import type {
  RequirementLineView,
  RequirementListVersionBody,
  RequirementListDetail,
  RequirementListSummary,
  RequirementListVersionSummary,
  RequirementListVersionView,
} from '@stavemark/shared';
import { toPersonRef } from '../rubrics/rubrics.mapper.js';
import type { RequirementLineRow } from './entities/requirement-line.entity.js';
import type { RequirementListVersion } from './entities/requirement-list-version.entity.js';
import type { RequirementList } from './entities/requirement-list.entity.js';

export function toLineView(l: RequirementLineRow): RequirementLineView {
  const rv = l.rubricVersion;
  if (!rv) throw new Error('requirement line loaded without its rubric version');
  return {
    id: l.id,
    kind: l.kind,
    ...(l.label ? { label: l.label } : {}),
    keys: l.keys,
    modes: l.modes,
    hands: l.hands,
    motions: l.motions,
    octaves: l.octaves,
    ...(l.directions ? { directions: l.directions } : {}),
    articulations: l.articulations,
    dynamics: l.dynamics,
    inversions: l.inversions,
    tempo: { bpm: l.tempoBpm, beatUnit: l.tempoBeatUnit, notesPerBeat: l.tempoNotesPerBeat },
    rubricVersionId: l.rubricVersionId,
    difficultyWeight: l.difficultyWeight,
    ...(l.titles ? { titles: l.titles } : {}),
    ...(l.durationSeconds !== null ? { durationSeconds: l.durationSeconds } : {}),
    rubric: {
      id: rv.id,
      rubricId: rv.rubricId,
      name: rv.name,
      version: rv.version,
      status: rv.status,
    },
  };
}

export function toListVersionSummary(v: RequirementListVersion): RequirementListVersionSummary {
  if (!v.lines) throw new Error('requirement list version loaded without its lines');
  return {
    id: v.id,
    listId: v.listId,
    version: v.version,
    status: v.status,
    name: v.name,
    grade: v.grade,
    totalMarks: v.totalMarks,
    lineCount: v.lines.length,
    usedAt: v.usedAt?.toISOString() ?? null,
    createdAt: v.createdAt.toISOString(),
    publishedAt: v.publishedAt?.toISOString() ?? null,
  };
}

export function toListVersionView(v: RequirementListVersion): RequirementListVersionView {
  const { lineCount: _n, ...summary } = toListVersionSummary(v);
  return {
    ...summary,
    selectionRule: { count: v.selectionRule.count, minPerKind: { ...v.selectionRule.minPerKind } },
    lines: [...v.lines!].sort((a, b) => a.position - b.position).map(toLineView),
    createdBy: toPersonRef(v.createdBy),
    publishedBy: toPersonRef(v.publishedBy),
  };
}

/** `versions`: those the caller may see, newest first (at least one). */
export function toListSummary(
  l: RequirementList,
  versions: RequirementListVersion[],
): RequirementListSummary {
  const latest = versions[0];
  if (!latest) throw new Error('requirement list summary without a visible version');
  const published = versions.find((v) => v.status === 'published');
  return {
    id: l.id,
    name: latest.name,
    grade: latest.grade,
    starterKey: l.starterKey,
    latest: toListVersionSummary(latest),
    published: published ? toListVersionSummary(published) : null,
    versionCount: versions.length,
  };
}

export function toListDetail(
  l: RequirementList,
  versions: RequirementListVersion[],
): RequirementListDetail {
  return { ...toListSummary(l, versions), versions: versions.map(toListVersionSummary) };
}

/** Rows for the body's lines; a line keeps its id when it names one of this draft's lines. */
export function toLineRows(
  listVersionId: string,
  body: Pick<RequirementListVersionBody, 'lines'>,
  keepIds: ReadonlySet<string> = new Set(),
): Partial<RequirementLineRow>[] {
  return body.lines.map((l, position) => ({
    ...(l.id && keepIds.has(l.id) ? { id: l.id } : {}),
    listVersionId,
    position,
    kind: l.kind,
    label: l.label || null,
    keys: [...new Set(l.keys.map(normaliseKeyName))],
    modes: l.modes,
    hands: l.hands,
    motions: l.motions,
    octaves: l.octaves,
    directions: l.directions && l.directions.length > 0 ? l.directions : null,
    articulations: l.articulations,
    dynamics: l.dynamics,
    inversions: l.inversions,
    tempoBpm: l.tempo.bpm,
    tempoBeatUnit: l.tempo.beatUnit,
    tempoNotesPerBeat: l.tempo.notesPerBeat,
    rubricVersionId: l.rubricVersionId,
    difficultyWeight: l.difficultyWeight,
    titles: l.titles && l.titles.length > 0 ? l.titles : null,
    durationSeconds: l.durationSeconds ?? null,
  }));
}
