import type {
  PersonRef,
  RubricBody,
  RubricCriterion,
  RubricDetail,
  RubricSummary,
  RubricVersionSummary,
  RubricVersionView,
} from '@stavemark/shared';
import type { Person } from '../users/entities/person.entity.js';
import type { RubricCriterionRow } from './entities/rubric-criterion.entity.js';
import type { RubricVersion } from './entities/rubric-version.entity.js';
import type { Rubric } from './entities/rubric.entity.js';

export function toPersonRef(p: Person | null | undefined): PersonRef | null {
  return p ? { id: p.id, displayName: p.displayName } : null;
}

export function toCriterion(c: RubricCriterionRow): RubricCriterion {
  return {
    key: c.key,
    label: c.label,
    ...(c.description ? { description: c.description } : {}),
    weight: c.weight,
    maxMark: c.maxMark,
    descriptors: c.descriptors.map((d) => ({ min: d.min, max: d.max, text: d.text })),
  };
}

export function toVersionSummary(v: RubricVersion): RubricVersionSummary {
  if (!v.criteria) throw new Error('rubric version loaded without its criteria');
  return {
    id: v.id,
    rubricId: v.rubricId,
    version: v.version,
    status: v.status,
    name: v.name,
    kinds: v.kinds,
    criteriaCount: v.criteria.length,
    createdAt: v.createdAt.toISOString(),
    publishedAt: v.publishedAt?.toISOString() ?? null,
  };
}

export function toVersionView(v: RubricVersion): RubricVersionView {
  const { criteriaCount: _count, ...summary } = toVersionSummary(v);
  return {
    ...summary,
    criteria: [...v.criteria!].sort((a, b) => a.position - b.position).map(toCriterion),
    createdBy: toPersonRef(v.createdBy),
    publishedBy: toPersonRef(v.publishedBy),
  };
}

/** `versions` must be the versions the caller may see, newest first (at least one). */
export function toRubricSummary(r: Rubric, versions: RubricVersion[]): RubricSummary {
  const latest = versions[0];
  if (!latest) throw new Error('rubric summary without a visible version');
  const published = versions.find((v) => v.status === 'published');
  return {
    id: r.id,
    name: latest.name,
    kinds: latest.kinds,
    starterKey: r.starterKey,
    latest: toVersionSummary(latest),
    published: published ? toVersionSummary(published) : null,
    versionCount: versions.length,
  };
}

export function toRubricDetail(r: Rubric, versions: RubricVersion[]): RubricDetail {
  return { ...toRubricSummary(r, versions), versions: versions.map(toVersionSummary) };
}

/** Rows for a version's criteria, in the order given. */
export function toCriterionRows(
  rubricVersionId: string,
  body: Pick<RubricBody, 'criteria'>,
): Partial<RubricCriterionRow>[] {
  return body.criteria.map((c, position) => ({
    rubricVersionId,
    position,
    key: c.key,
    label: c.label,
    description: c.description ?? null,
    weight: c.weight,
    maxMark: c.maxMark,
    descriptors: c.descriptors,
  }));
}
