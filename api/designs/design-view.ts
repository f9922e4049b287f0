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
const OPEN_BRACE = 0x7b;
const CLOSE_BRACE = 0x7d;

/**
 * The JSON text of designView(record) in UTF-8, byte for byte, built around the revision's
 * stored JSON bytes (`{"spec":…,"design":…,"meta":…}`) instead of serializing and encoding the
 * design again: the view is those members between the id and revision in front and the caution
 * and links behind.
 */
export function designViewJson(
  record: Pick<DesignRevisionRecord, 'id' | 'revision' | 'contentJson'>,
): Buffer<ArrayBuffer> {
  const { contentJson } = record;
  if (contentJson[0] !== OPEN_BRACE || contentJson[contentJson.length - 1] !== CLOSE_BRACE) {
    throw new Error(
      `design ${record.id} revision ${record.revision}: stored text is not a content`,
    );
  }
  const head = `{"id":${JSON.stringify(record.id)},"revision":${JSON.stringify(record.revision)},`;
  const tail = `,"caution":${CAUTION_JSON},"links":${JSON.stringify(designLinks(record))}}`;
  return Buffer.concat([
    Buffer.from(head, 'utf8'),
    contentJson.subarray(1, -1),
    Buffer.from(tail, 'utf8'),
  ]);
}
