import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestKey } from '@angular/cdk/testing';
import { TestBed } from '@angular/core/testing';
import { beforeEach, describe, expect, it } from 'vitest';
import { provideTestApp } from '../../testing/test-app';
import { CommentBox, mentionCandidates, mentionQuery } from './comment-box';
import { MEMBERS } from './testing/review-fixtures';
import { CommentBoxHarness } from './testing/review-harnesses';

describe('mention parsing', () => {
  it('finds the @… being typed at the caret, after a space or at the start, up to one space inside', () => {
    expect(mentionQuery('@', 1)).toEqual({ start: 0, query: '' });
    expect(mentionQuery('Check @De', 9)).toEqual({ start: 6, query: 'De' });
    expect(mentionQuery('Check @Dev Ar', 13)).toEqual({ start: 6, query: 'Dev Ar' });
    expect(mentionQuery('mail dev@tamsk', 14)).toBeNull();
    expect(mentionQuery('@Dev Arjunan and more', 21)).toBeNull();
  });

  it('offers members whose name or e-mail starts with the query', () => {
    expect(mentionCandidates(MEMBERS, 'ar').map((m) => m.name)).toEqual(['Dev Arjunan']);
    expect(mentionCandidates(MEMBERS, 'lotte.b').map((m) => m.name)).toEqual(['Lotte Brandvik']);
    expect(mentionCandidates(MEMBERS, '')).toHaveLength(4);
    expect(mentionCandidates(MEMBERS, 'zz')).toEqual([]);
  });
});

describe('CommentBox', () => {
  beforeEach(() => TestBed.configureTestingModule({ providers: provideTestApp() }));

  async function render() {
    const fixture = TestBed.createComponent(CommentBox);
    fixture.componentRef.setInput('members', MEMBERS);
    fixture.componentRef.setInput('label', 'Start a thread');
    const sent: string[] = [];
    fixture.componentInstance.submitted.subscribe((body) => sent.push(body));
    fixture.detectChanges();
    const harness = await TestbedHarnessEnvironment.harnessForFixture(fixture, CommentBoxHarness);
    return { fixture, harness, sent };
  }

  it('offers project members after @ and puts the chosen name in the text', async () => {
    const { harness, sent } = await render();
    expect(await harness.canSend()).toBe(false);
    await harness.type('Please check the trip, @');
    expect(await harness.getSuggestions()).toEqual(['Dev Arjunan (engineer)', 'Lotte Brandvik (reviewer)', 'Mara Okonkwo (lead)', 'Pim Vasquez (viewer)']);
    await harness.type('m');
    expect(await harness.getSuggestions()).toEqual(['Mara Okonkwo (lead)']);
    await harness.press(TestKey.ENTER);
    expect(await harness.getText()).toBe('Please check the trip, @Mara Okonkwo ');
    expect(await harness.getSuggestions()).toEqual([]);
    await harness.send();
    expect(sent).toEqual(['Please check the trip, @Mara Okonkwo']);
  });

  it('leaves one space after a picked mention when the person types their own', async () => {
    const { harness, sent } = await render();
    await harness.type('@Dev');
    await harness.press(TestKey.ENTER);
    await harness.type(' please check the trip');
    expect(await harness.getText()).toBe('@Dev Arjunan please check the trip');
    await harness.send();
    expect(sent).toEqual(['@Dev Arjunan please check the trip']);
  });

  it('moves through the suggestions with the arrow keys and closes them with Escape', async () => {
    const { harness } = await render();
    await harness.type('@');
    expect(await harness.getActiveSuggestion()).toBe('Dev Arjunan (engineer)');
    await harness.press(TestKey.DOWN_ARROW);
    await harness.press(TestKey.DOWN_ARROW);
    expect(await harness.getActiveSuggestion()).toBe('Mara Okonkwo (lead)');
    await harness.press(TestKey.UP_ARROW);
    await harness.press(TestKey.TAB);
    expect(await harness.getText()).toBe('@Lotte Brandvik ');
    await harness.type('@p');
    await harness.press(TestKey.ESCAPE);
    expect(await harness.getSuggestions()).toEqual([]);
    expect(await harness.getText()).toBe('@Lotte Brandvik @p');
  });

  it('sends with Ctrl+Enter and keeps the text until the parent says it was saved', async () => {
    const { harness, sent, fixture } = await render();
    await harness.type('Cp table from the invented panel run?');
    await harness.press(TestKey.ENTER, { control: true });
    expect(sent).toEqual(['Cp table from the invented panel run?']);
    expect(await harness.getText()).toBe('Cp table from the invented panel run?');
    fixture.componentInstance.clear();
    expect(await harness.getText()).toBe('');
  });
});
