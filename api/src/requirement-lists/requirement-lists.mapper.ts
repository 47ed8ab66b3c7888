import type {
  RequirementLineView,
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
    rubric: { id: rv.id, rubricId: rv.rubricId, name: rv.name, version: rv.version, status: rv.status },
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
export function toListSummary(l: RequirementList, versions: RequirementListVersion[]): RequirementListSummary {
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

export function toListDetail(l: RequirementList, versions: RequirementListVersion[]): RequirementListDetail {
  return { ...toListSummary(l, versions), versions: versions.map(toListVersionSummary) };
}
