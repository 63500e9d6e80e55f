import { type BaseHarnessFilters, ComponentHarness, HarnessPredicate, type TestElement, TestKey } from '@angular/cdk/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatCheckboxHarness } from '@angular/material/checkbox/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';

/** A comment box with its @-mention suggestions, as a person types in it. */
export class CommentBoxHarness extends ComponentHarness {
  static hostSelector = 'lam-comment-box';

  static with(options: BaseHarnessFilters & { label?: string | RegExp } = {}): HarnessPredicate<CommentBoxHarness> {
    return new HarnessPredicate(CommentBoxHarness, options).addOption('label', options.label, async (harness, label) =>
      HarnessPredicate.stringMatches((await harness.locatorFor('mat-label')()).text(), label),
    );
  }

  private readonly textarea = this.locatorFor('textarea');
  private readonly options = this.locatorForAll('[role="option"]');
  private readonly sendButton = this.locatorFor(MatButtonHarness.with({ selector: '.send' }));

  async getText(): Promise<string> {
    return (await this.textarea()).getProperty<string>('value');
  }

  async type(text: string): Promise<void> {
    const area = await this.textarea();
    await area.focus();
    await area.sendKeys(text);
  }

  async press(key: TestKey, modifiers: { control?: boolean } = {}): Promise<void> {
    await (await this.textarea()).sendKeys(modifiers, key);
  }

  /** The members offered for the `@…` being typed, as "Name (role)". */
  async getSuggestions(): Promise<string[]> {
    return Promise.all((await this.options()).map((o) => this.optionText(o)));
  }

  async getActiveSuggestion(): Promise<string | null> {
    for (const o of await this.options()) if ((await o.getAttribute('aria-selected')) === 'true') return this.optionText(o);
    return null;
  }

  private async optionText(option: TestElement): Promise<string> {
    return `${await option.text({ exclude: '.role' })} (${await option.text({ exclude: '.name' })})`.replace(/\s+/g, ' ');
  }

  async canSend(): Promise<boolean> {
    return !(await (await this.sendButton()).isDisabled());
  }

  async send(): Promise<void> {
    await (await this.sendButton()).click();
  }
}

/** One comment of a thread. */
export interface CommentView {
  author: string;
  /** The rendered text, as read. */
  text: string;
  /** The rendered HTML, to check what the sanitiser kept. */
  html: string;
  edited: boolean;
  editable: boolean;
}

/** One comment thread: its head, its comments, reply, edit, history, resolve and reopen. */
export class CommentThreadHarness extends ComponentHarness {
  static hostSelector = 'lam-comment-thread';

  private readonly origin = this.locatorFor('.origin');
  private readonly changed = this.locatorForOptional('.changed');
  private readonly anchor = this.locatorForOptional('.anchor');
  private readonly resolvedTag = this.locatorForOptional('.resolved-tag');
  private readonly comments = this.locatorForAll('.comment');
  private readonly resolveButton = this.locatorForOptional(MatButtonHarness.with({ selector: '.resolve' }));
  private readonly reopenButton = this.locatorForOptional(MatButtonHarness.with({ selector: '.reopen' }));
  private readonly replyButton = this.locatorForOptional(MatButtonHarness.with({ selector: '.reply-button' }));
  private readonly expandButton = this.locatorForOptional(MatButtonHarness.with({ selector: '.expand' }));

  async getOrigin(): Promise<string> {
    return (await (await this.origin()).text({ exclude: 'mat-icon' })).trim();
  }

  async saysCellChanged(): Promise<boolean> {
    return (await this.changed()) !== null;
  }

  async getAnchor(): Promise<string | null> {
    const anchor = await this.anchor();
    return anchor ? (await anchor.text({ exclude: 'mat-icon' })).replace(/\s+/g, ' ').trim() : null;
  }

  async getResolvedNote(): Promise<string | null> {
    const tag = await this.resolvedTag();
    return tag ? (await tag.text({ exclude: 'mat-icon' })).trim() : null;
  }

  async getComments(): Promise<CommentView[]> {
    const items = await this.comments();
    return Promise.all(
      items.map(async (item) => {
        const at = `[data-comment-id="${await item.getAttribute('data-comment-id')}"]`;
        const markdown = await this.locatorForOptional(`${at} > lam-comment-body .markdown`)();
        const meta = await (await this.locatorFor(`${at} > .meta`)()).text();
        return {
          author: (await (await this.locatorFor(`${at} .author`)()).text()).trim(),
          text: markdown ? (await markdown.text()).trim() : '',
          html: markdown ? await markdown.getProperty<string>('innerHTML') : '',
          edited: /edited/.test(meta),
          editable: (await this.locatorForOptional(`${at} > .meta .edit-button`)()) !== null,
        };
      }),
    );
  }

  async canResolve(): Promise<boolean> {
    return (await this.resolveButton()) !== null;
  }

  async canReopen(): Promise<boolean> {
    return (await this.reopenButton()) !== null;
  }

  async resolve(): Promise<void> {
    const button = await this.resolveButton();
    if (!button) throw new Error('This thread offers no Resolve');
    await button.click();
  }

  async reopen(): Promise<void> {
    const button = await this.reopenButton();
    if (!button) throw new Error('This thread offers no Reopen');
    await button.click();
  }

  async canReply(): Promise<boolean> {
    return (await this.replyButton()) !== null;
  }

  /** Opens the reply box and gives it back. */
  async openReply(): Promise<CommentBoxHarness> {
    const button = await this.replyButton();
    if (!button) throw new Error('This thread offers no Reply');
    await button.click();
    return this.locatorFor(CommentBoxHarness.with({ label: 'Reply' }))();
  }

  async isCollapsed(): Promise<boolean> {
    return (await this.expandButton()) !== null;
  }

  async expand(): Promise<void> {
    await (await this.expandButton())?.click();
  }

  /** Starts editing the n-th comment (0-based) and gives back the edit box. */
  async edit(index: number): Promise<CommentBoxHarness> {
    const at = `[data-comment-id="${await (await this.comments())[index]!.getAttribute('data-comment-id')}"]`;
    const button = await this.locatorForOptional(MatButtonHarness.with({ ancestor: at, selector: '.edit-button' }))();
    if (!button) throw new Error(`Comment ${index + 1} cannot be edited here`);
    await button.click();
    return this.locatorFor(CommentBoxHarness.with({ label: 'Edit your comment' }))();
  }

  /** Opens (or closes) the earlier texts of the n-th comment. */
  async toggleHistory(index: number): Promise<void> {
    const at = `[data-comment-id="${await (await this.comments())[index]!.getAttribute('data-comment-id')}"]`;
    await (await this.locatorFor(MatButtonHarness.with({ ancestor: at, selector: '.history-button' }))()).click();
  }

  /** The earlier texts shown for the n-th comment, oldest first. */
  async getHistory(index: number): Promise<string[]> {
    const at = `[data-comment-id="${await (await this.comments())[index]!.getAttribute('data-comment-id')}"]`;
    const texts = await this.locatorForAll(`${at} .history li lam-comment-body`)();
    return Promise.all(texts.map(async (t) => (await t.text()).trim()));
  }
}

/** A cell's comment panel: the threads, the new-thread box and its anchor fields. */
export class CellThreadsHarness extends ComponentHarness {
  static hostSelector = 'lam-cell-threads';

  private readonly panel = this.locatorForOptional('.panel');
  private readonly counts = this.locatorForOptional('.counts');
  private readonly readOnly = this.locatorForOptional('.read-only');
  private readonly anchorCheckbox = this.locatorForOptional(MatCheckboxHarness);
  private readonly pins = this.locatorForAll('lam-anchor-strip .pin');

  async isOpen(): Promise<boolean> {
    return (await this.panel()) !== null;
  }

  async getCounts(): Promise<string | null> {
    const counts = await this.counts();
    return counts ? (await counts.text()).replace(/\s+/g, ' ').trim() : null;
  }

  async getThreads(): Promise<CommentThreadHarness[]> {
    return this.locatorForAll(CommentThreadHarness)();
  }

  /** Unfolds the resolved threads (folded away by default). */
  async showResolved(): Promise<void> {
    const button = await this.locatorForOptional(MatButtonHarness.with({ selector: '.show-resolved' }))();
    if (!button) throw new Error('No resolved threads are folded away here');
    await button.click();
  }

  async getReadOnlyNote(): Promise<string | null> {
    const note = await this.readOnly();
    return note ? note.text() : null;
  }

  async getNewThreadBox(): Promise<CommentBoxHarness | null> {
    return this.locatorForOptional(CommentBoxHarness.with({ label: 'Start a thread' }))();
  }

  /** Points the next thread at x/c on a surface of the plot. */
  async pointAt(surface: string, x: string): Promise<void> {
    const box = await this.anchorCheckbox();
    if (!box) throw new Error('No anchor choice here');
    await box.check();
    const select = await this.locatorFor(MatSelectHarness)();
    await select.open();
    await select.clickOptions({ text: surface });
    const input = await this.locatorFor(MatInputHarness.with({ selector: '[type="number"]' }))();
    await input.setValue(x);
  }

  /** The pins of anchored threads beside the plot, by their labels. */
  async getPins(): Promise<string[]> {
    return Promise.all((await this.pins()).map(async (p) => (await p.getAttribute('aria-label')) ?? ''));
  }
}

/** The button in a cell's head that opens its comments. */
export class CellThreadsButtonHarness extends ComponentHarness {
  static hostSelector = 'lam-cell-threads-button';
  private readonly button = this.locatorFor('button');
  private readonly anyButton = this.locatorForOptional('button');

  /** Whether the head offers the button at all. */
  async isShown(): Promise<boolean> {
    return (await this.anyButton()) !== null;
  }

  async getLabel(): Promise<string> {
    return (await (await this.button()).getAttribute('aria-label')) ?? '';
  }

  async toggle(): Promise<void> {
    await (await this.button()).click();
  }
}
