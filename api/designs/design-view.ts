import { CAUTION } from '../caution.js';
import type { DesignView } from '../schemas/design-view-schema.js';
import type { DesignRevisionRecord } from '../stores/design-store.js';

/** The links of a revision's view: itself, its design's latest, its list and its netlist. */
function designLinks(record: Pick<DesignRevisionRecord, 'id' | 'revision'>): DesignView['links'] {
  const base = `/v1/designs/${encodeURIComponent(record.id)}`;
  return {
    self: `${base}/revisions/${record.revision}`,
    latest: base,
    revisions: `${base}/revisions`,
    netlist: `${base}/netlist?revision=${record.revision}`,
  };
}

/** The API view of one stored revision: the record, the caution and links to its neighbours. */
export function designView(record: DesignRevisionRecord): DesignView {
  return {
    id: record.id,
    revision: record.revision,
    spec: record.spec,
    design: record.design,
    meta: record.meta,
    caution: CAUTION,
    links: designLinks(record),
  };
}

const CAUTION_JSON = JSON.stringify(CAUTION);

/**
 * The JSON text of designView(record), byte for byte, built around the revision's stored JSON
 * text (`{"spec":…,"design":…,"meta":…}`, numbers already checked finite) instead of serializing
 * the design again: the view is those members between the id and revision in front and the
 * caution and links behind.
 */
export function designViewJson(record: DesignRevisionRecord): string {
  const { contentJson } = record;
  if (!contentJson.startsWith('{"spec":') || !contentJson.endsWith('}')) {
    throw new Error(
      `design ${record.id} revision ${record.revision}: stored text is not a content`,
    );
  }
  return (
    `{"id":${JSON.stringify(record.id)},"revision":${JSON.stringify(record.revision)},` +
    `${contentJson.slice(1, -1)},"caution":${CAUTION_JSON},` +
    `"links":${JSON.stringify(designLinks(record))}}`
  );
}
