import { type BaseHarnessFilters, ComponentHarness, HarnessPredicate, type ModifierKeys, type TestKey } from '@angular/cdk/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatMenuHarness } from '@angular/material/menu/testing';

export interface CellFrameHarnessFilters extends BaseHarnessFilters {
  /** The cell's title (as shown, or in its title field). */
  title?: string | RegExp;
}

/** A menu item's text without the name of its icon, which the icon font draws from that text. */
function withoutIconName(text: string): string {
  return text.replace(/^[a-z_]+(?=[A-Z])/, '');
}

/** A cell frame of the notebook stack, as a person sees and uses it. */
export class CellFrameHarness extends ComponentHarness {
  static hostSelector = 'lam-cell-frame';

  static with(options: CellFrameHarnessFilters = {}): HarnessPredicate<CellFrameHarness> {
    return new HarnessPredicate(CellFrameHarness, options).addOption('title', options.title, (harness, title) =>
      HarnessPredicate.stringMatches(harness.getTitle(), title),
    );
  }

  private readonly titleInput = this.locatorForOptional('.title-input');
  private readonly titleHeading = this.locatorFor('.title');
  private readonly kindLabel = this.locatorFor('.kind-label');
  private readonly runState = this.locatorForOptional('.run-state-label');
  private readonly failure = this.locatorForAll('.failure');
  private readonly body = this.locatorForOptional('.body');
  private readonly runButton = this.locatorForOptional(MatButtonHarness.with({ text: /Run/ }));
  private readonly collapseButton = this.locatorFor(MatButtonHarness.with({ selector: '.collapse-button' }));
  private readonly menuButton = this.locatorForOptional(MatMenuHarness.with({ selector: '[aria-label^="Actions for"]' }));

  async getTitle(): Promise<string> {
    const input = await this.titleInput();
    return input ? input.getProperty<string>('value') : (await this.titleHeading()).text();
  }

  /** Whether the title can be edited here. */
  async isTitleEditable(): Promise<boolean> {
    return (await this.titleInput()) !== null;
  }

  async setTitle(title: string): Promise<void> {
    const input = await this.titleInput();
    if (!input) throw new Error('The cell title cannot be edited here');
    await input.clear();
    await input.sendKeys(title);
  }

  /** Presses a key in the cell's title field, as a keyboard shortcut is pressed while working in the cell. */
  async pressInTitle(modifiers: ModifierKeys, key: TestKey): Promise<void> {
    const input = await this.titleInput();
    if (!input) throw new Error('The cell title cannot be edited here');
    await input.focus();
    await input.sendKeys(modifiers, key);
  }

  async getKindLabel(): Promise<string> {
    return (await this.kindLabel()).text();
  }

  /** The run state as worded on the cell, or null for kinds that do not run. */
  async getRunState(): Promise<string | null> {
    const label = await this.runState();
    return label ? label.text() : null;
  }

  /** The failure and not-run messages shown on the cell. */
  async getFailures(): Promise<string[]> {
    return Promise.all((await this.failure()).map((f) => f.text()));
  }

  async canRun(): Promise<boolean> {
    const button = await this.runButton();
    return button !== null && !(await button.isDisabled());
  }

  async run(): Promise<void> {
    const button = await this.runButton();
    if (!button) throw new Error('This cell offers no Run');
    await button.click();
  }

  async isCollapsed(): Promise<boolean> {
    return (await this.body()) === null;
  }

  async toggleCollapsed(): Promise<void> {
    await (await this.collapseButton()).click();
  }

  async hasActions(): Promise<boolean> {
    return (await this.menuButton()) !== null;
  }

  /** The action menu's items, with whether each is enabled. */
  async getActions(): Promise<{ text: string; enabled: boolean }[]> {
    const menu = await this.actionsMenu();
    await menu.open();
    const items = await menu.getItems();
    const actions = await Promise.all(
      items.map(async (item) => ({ text: withoutIconName(await item.getText()), enabled: !(await item.isDisabled()) })),
    );
    await menu.close();
    return actions;
  }

  /** Picks an action (Duplicate, Move up, Move down, Remove) from the cell's menu. */
  async chooseAction(text: string): Promise<void> {
    const menu = await this.actionsMenu();
    await menu.open();
    await menu.clickItem({ text: new RegExp(`${text}$`) });
  }

  private async actionsMenu(): Promise<MatMenuHarness> {
    const menu = await this.menuButton();
    if (!menu) throw new Error('This cell offers no actions');
    return menu;
  }
}
