import { ComponentHarness } from '@angular/cdk/testing';

/** The flow-condition cell's derived free stream, quantity by quantity. */
export class FlowCellHarness extends ComponentHarness {
  static hostSelector = 'lam-flow-cell';

  private readonly quantities = this.locatorForAll('.quantity');
  private readonly values = this.locatorForAll('.quantity dd');
  private readonly implied = this.locatorForOptional('.implied-value');
  private readonly impliedNote = this.locatorForOptional('.implied .note');
  private readonly waiting = this.locatorForOptional('.waiting');

  /** Derived values by symbol (Re, ν∞, V∞, q∞, …), each as shown with its unit. */
  async getDerived(): Promise<Record<string, string>> {
    const [quantities, values] = await Promise.all([this.quantities(), this.values()]);
    const derived: Record<string, string> = {};
    for (let i = 0; i < quantities.length; i++) {
      const symbol = await quantities[i].getAttribute('data-quantity');
      if (symbol) derived[symbol] = (await values[i].text()).replace(/\s+/g, ' ').trim();
    }
    return derived;
  }

  /** Why nothing can be derived yet, if so. */
  async getWaitingReason(): Promise<string | null> {
    const waiting = await this.waiting();
    return waiting ? waiting.text() : null;
  }

  /** The note beside the implied N_crit (a turbulence level outside Mack's range), if any. */
  async getImpliedNote(): Promise<string | null> {
    const note = await this.impliedNote();
    return note ? note.text() : null;
  }

  /** The N_crit a turbulence level implies, or null when N_crit is given directly. */
  async getImpliedNCrit(): Promise<string | null> {
    const implied = await this.implied();
    return implied ? implied.text() : null;
  }
}

/** The pressure cell's list of table problems. */
export class PressureCellHarness extends ComponentHarness {
  static hostSelector = 'lam-pressure-cell';

  private readonly lines = this.locatorForAll('.problems .line-link');
  private readonly messages = this.locatorForAll('.problems .problem-message');
  private readonly stagnation = this.locatorForOptional('.facts dd.lam-mono');

  /** The table's problems as listed: "Line 5" (or "Table") and the message. */
  async getLineProblems(): Promise<{ line: string; message: string }[]> {
    const [lines, messages] = await Promise.all([this.lines(), this.messages()]);
    return Promise.all(lines.map(async (line, i) => ({ line: (await line.text()).trim(), message: (await messages[i].text()).trim() })));
  }

  private readonly warningTexts = this.locatorForAll('.table-warning');
  private readonly uploadProblemText = this.locatorForOptional('.field-problem');
  private readonly replacedNotice = this.locatorForOptional('.replaced');
  private readonly putBackButton = this.locatorForOptional('.put-back');

  /** Warnings on a table that reads (a loop pasted as one surface, no stagnation point at its start). */
  async getWarnings(): Promise<string[]> {
    return Promise.all((await this.warningTexts()).map((w) => w.text({ exclude: 'mat-icon' })));
  }

  async getUploadProblem(): Promise<string | null> {
    const p = await this.uploadProblemText();
    return p ? p.text() : null;
  }

  /** The note that an upload replaced the table, if shown. */
  async getReplacedNote(): Promise<string | null> {
    const p = await this.replacedNotice();
    return p ? p.text({ exclude: '.put-back, mat-icon' }) : null;
  }

  async putBack(): Promise<void> {
    const button = await this.putBackButton();
    if (!button) throw new Error('no “Put back the previous table” button');
    await button.click();
  }

  async getStagnationPoint(): Promise<string | null> {
    const dd = await this.stagnation();
    return dd ? dd.text() : null;
  }
}
