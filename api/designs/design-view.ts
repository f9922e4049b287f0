import { CAUTION } from '../caution.js';
import type { DesignView } from '../schemas/design-view-schema.js';
import type { DesignRevisionRecord } from '../stores/design-store.js';

/** The API view of one stored revision: the record, the caution and links to its neighbours. */
export function designView(record: DesignRevisionRecord): DesignView {
  const base = `/v1/designs/${encodeURIComponent(record.id)}`;
  return {
    id: record.id,
    revision: record.revision,
    spec: record.spec,
    design: record.design,
    meta: record.meta,
    caution: CAUTION,
    links: {
      self: `${base}/revisions/${record.revision}`,
      latest: base,
      revisions: `${base}/revisions`,
      netlist: `${base}/netlist?revision=${record.revision}`,
    },
  };
}
