import path from 'node:path';

import { BaseSequencer, type TestSpecification } from 'vitest/node';

/**
 * The browser tests share one server and one database, and some take the demo job through steps that others then
 * build on (the grind orders are issued before the owner approves; an approval fixes which revision can be issued).
 * So they run in this order every time, not by earlier run times or file size; a file not listed runs after these, by name.
 */
const ORDER = ['orders', 'owner', 'measurements', 'compare', 'forms', 'team', 'fits-core', 'jobs', 'accounts', 'limits', 'roles'];

const rank = (spec: TestSpecification) => {
  const name = path.basename(spec.moduleId).replace(/\.test\.ts$/, '');
  const at = ORDER.indexOf(name);
  return { at: at === -1 ? ORDER.length : at, name };
};

export default class BrowserTestOrder extends BaseSequencer {
  override async sort(files: TestSpecification[]): Promise<TestSpecification[]> {
    return [...files].sort((a, b) => {
      const x = rank(a);
      const y = rank(b);
      return x.at - y.at || x.name.localeCompare(y.name);
    });
  }
}
