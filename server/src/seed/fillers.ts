import { fillDemoNacelleNotebook, fillDemoNotebook } from '../notebook/demo-filler';
import type { DemoStudyFiller } from './demo';

/**
 * What the later parts of the product add to the demo study when it is first created (cells of the
 * notebook, a first version). Each part appends its filler here.
 */
export const demoStudyFillers: DemoStudyFiller[] = [fillDemoNotebook];

/** What fills the nacelle project's demo study when it is first created. */
export const demoNacelleFillers: DemoStudyFiller[] = [fillDemoNacelleNotebook];
