import { type BaseHarnessFilters, ComponentHarness, HarnessPredicate } from '@angular/cdk/testing';

/** Text as a person reads it: without the names of the icons the icon font draws from text. */
function readable(text: string): string {
  return text
    .replace(/\b(north_east|south_west|add_circle|remove_circle|edit|swap_vert|check|notes|air|ssid_chart|insights|straighten|change_history|tune)(?=[A-Z]|\s|$)/g, '')
    .replace(/\s+/g, ' ')
    .trim();
}

export interface DeltaRowText {
  quantity: string;
  a: string;
  b: string;
  delta: string;
  /** favourable, adverse or neutral, as the row is marked. */
  effect: string;
  cue: string;
}

export class DeltaRowHarness extends ComponentHarness {
  static hostSelector = 'tbody tr';
  private readonly cells = this.locatorForAll('th, td');

  async read(): Promise<DeltaRowText> {
    const values = await Promise.all((await this.cells()).map(async (c) => readable(await c.text())));
    return { quantity: values[0]!, a: values[1]!, b: values[2]!, delta: values[3]!, effect: (await (await this.host()).getAttribute('data-effect')) ?? '', cue: values[4]! };
  }
}

/** One surface's table of deltas on the compare page. */
export class DeltaTableHarness extends ComponentHarness {
  static hostSelector = 'table.deltas';
  private readonly rows = this.locatorForAll(DeltaRowHarness);

  async getLabel(): Promise<string | null> {
    return (await this.host()).getAttribute('aria-label');
  }

  async getRows(): Promise<DeltaRowText[]> {
    return Promise.all((await this.rows()).map((r) => r.read()));
  }
}

export class CellDiffFieldHarness extends ComponentHarness {
  static hostSelector = '.field';
  private readonly label = this.locatorFor('dt');
  private readonly value = this.locatorFor('dd');

  async read(): Promise<string> {
    return `${readable(await (await this.label()).text())}: ${readable(await (await this.value()).text())}`;
  }
}

export class CellDiffItemHarness extends ComponentHarness {
  static hostSelector = 'li.diff';
  private readonly fields = this.locatorForAll(CellDiffFieldHarness);

  async getChange(): Promise<string> {
    return (await (await this.host()).getAttribute('data-change')) ?? '';
  }

  /** The cell's title, as the item is labelled. */
  async getTitle(): Promise<string> {
    return ((await (await this.host()).getAttribute('aria-label')) ?? '').replace(/^[^:]+: /, '');
  }

  /** Each changed input as "label: old → new". */
  async getFields(): Promise<string[]> {
    return Promise.all((await this.fields()).map((f) => f.read()));
  }
}

/** The list of cell differences (compare page, save conflict). */
export class CellDiffListHarness extends ComponentHarness {
  static hostSelector = 'lam-cell-diff-list';
  private readonly items = this.locatorForAll(CellDiffItemHarness);

  async getItems(): Promise<{ change: string; title: string; fields: string[] }[]> {
    return Promise.all((await this.items()).map(async (i) => ({ change: await i.getChange(), title: await i.getTitle(), fields: await i.getFields() })));
  }
}

export class InputRowHarness extends ComponentHarness {
  static hostSelector = '.inputs > div';
  private readonly label = this.locatorFor('dt');
  private readonly value = this.locatorFor('dd');

  async read(): Promise<string> {
    return `${(await (await this.label()).text()).trim()}: ${(await (await this.value()).text()).trim()}`;
  }
}

/** One cell of a saved version on the read-only version page. */
export class VersionCellHarness extends ComponentHarness {
  static hostSelector = 'li.cell';
  private readonly inputs = this.locatorForAll(InputRowHarness);
  private readonly summary = this.locatorForOptional('table.summary');

  static with(options: BaseHarnessFilters & { label?: string } = {}): HarnessPredicate<VersionCellHarness> {
    return new HarnessPredicate(VersionCellHarness, options).addOption('label', options.label, async (h, label) => (await (await h.host()).getAttribute('aria-label')) === label);
  }

  /** Each input as "label: value". */
  async getInputs(): Promise<string[]> {
    return Promise.all((await this.inputs()).map((r) => r.read()));
  }

  async getSummaryText(): Promise<string | null> {
    const table = await this.summary();
    return table ? table.text() : null;
  }

  async getText(): Promise<string> {
    return (await this.host()).text();
  }
}
