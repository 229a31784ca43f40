import { describe, expect, it } from 'vitest';
import { callingPlace, contactListsDiffer, describeListChange, summarizeContactChange, type ContactSnapshot } from '@domain/contact-changes';

const person = (name: string, phone: string, relation = 'Neighbour', altPhone = ''): ContactSnapshot => ({ name, relation, phone, altPhone });
const bram = person('Bram Trevane', '+15550104401', 'Brother');
const lena = person('Lena Quill', '+15550104402', 'Daughter');
const ora = person('Ora Neighbour', '+15550104403');
const cai = person('Cai Moss', '+15550104404');

describe('callingPlace', () => {
  it('says places in words up to ten, then by number', () => {
    expect([1, 2, 3, 10].map(callingPlace)).toEqual(['first', 'second', 'third', 'tenth']);
    expect(callingPlace(11)).toBe('number 11');
  });
});

describe('contactListsDiffer', () => {
  it('sees a different person, detail or order, and nothing else', () => {
    expect(contactListsDiffer([bram, lena], [{ ...bram }, { ...lena }])).toBe(false);
    expect(contactListsDiffer([], [])).toBe(false);
    expect(contactListsDiffer([bram, lena], [lena, bram])).toBe(true);
    expect(contactListsDiffer([bram], [{ ...bram, altPhone: '+15550104499' }])).toBe(true);
    expect(contactListsDiffer([bram], [bram, lena])).toBe(true);
  });
});

describe('describeListChange', () => {
  it('names who was added and removed, and who is now called first', () => {
    expect(describeListChange([bram, lena], [lena, ora])).toBe('Replaced the list: added Ora Neighbour; removed Bram Trevane; Lena Quill moved to first');
  });

  it('names the one contact lifted up the list, not everyone who shifted down', () => {
    expect(describeListChange([bram, lena, cai], [cai, bram, lena])).toBe('Replaced the list: Cai Moss moved to first');
  });

  it('names a contact moved down the list, moves in calling order', () => {
    expect(describeListChange([bram, lena, cai], [lena, cai, bram])).toBe('Replaced the list: Lena Quill moved to first; Bram Trevane moved to third');
  });

  it('a swap of two names the one now called first', () => {
    expect(describeListChange([bram, lena], [lena, bram])).toBe('Replaced the list: Lena Quill moved to first');
  });

  it('does not call a contact moved when an addition at the end leaves the order alone', () => {
    expect(describeListChange([bram, lena], [bram, lena, ora, cai])).toBe('Replaced the list: added Ora Neighbour and Cai Moss');
  });

  it('names changed details of a kept contact', () => {
    expect(describeListChange([bram, lena], [{ ...bram, phone: '+15550109999', altPhone: '+15550108888' }, { ...lena, relation: 'Niece' }])).toBe(
      'Replaced the list: new phone and other phone for Bram Trevane; new relation for Lena Quill',
    );
  });

  it('keeps a renamed contact by phone number, and matches names regardless of case and spacing', () => {
    expect(describeListChange([bram, lena], [{ ...bram, name: 'Bram Trevane-Holt' }, { ...lena, name: ' lena  quill ' }])).toBe('Replaced the list: renamed Bram Trevane to Bram Trevane-Holt');
  });

  it('says when the list was emptied or saved as it was', () => {
    expect(describeListChange([bram, lena, ora], [])).toBe('Cleared the list: removed Bram Trevane, Lena Quill and Ora Neighbour');
    expect(describeListChange([bram], [{ ...bram }])).toBe('Saved the list without changes');
    expect(describeListChange([], [ora])).toBe('Replaced the list: added Ora Neighbour');
  });

  it('tells two people of the same name apart by order', () => {
    const twin = person('Lena Quill', '+15550104477', 'Cousin');
    expect(describeListChange([lena, twin], [lena])).toBe('Replaced the list: removed Lena Quill');
  });
});

describe('summarizeContactChange', () => {
  it('describes a replaced list from its before and after', () => {
    expect(summarizeContactChange({ action: 'contacts.replaced', before: [bram], after: [bram, ora] })).toBe('Replaced the list: added Ora Neighbour');
  });

  it('falls back to the count when a replaced list has no lists recorded', () => {
    expect(summarizeContactChange({ action: 'contacts.replaced', count: 3 })).toBe('Replaced the list (3 contacts)');
    expect(summarizeContactChange({ action: 'contacts.replaced', count: 1 })).toBe('Replaced the list (1 contact)');
    expect(summarizeContactChange({ action: 'contacts.replaced' })).toBe('Replaced the list');
  });

  it('describes one contact added or removed, with or without its name', () => {
    expect(summarizeContactChange({ action: 'contact.created', name: 'Ora Neighbour', position: 2 })).toBe('Added Ora Neighbour in second place');
    expect(summarizeContactChange({ action: 'contact.created', position: 1 })).toBe('Added a contact in first place');
    expect(summarizeContactChange({ action: 'contact.deleted', name: 'Bram Trevane' })).toBe('Removed Bram Trevane');
    expect(summarizeContactChange({ action: 'contact.deleted' })).toBe('Removed a contact');
  });

  it('describes one contact changed: renamed, new details, moved', () => {
    expect(summarizeContactChange({ action: 'contact.updated', name: 'Lena Holt', previousName: 'Lena Quill', changed: ['name', 'phone', 'relation', 'position'], position: 1 })).toBe(
      'Renamed Lena Quill to Lena Holt; new phone and relation for Lena Holt; Lena Holt moved to first',
    );
    expect(summarizeContactChange({ action: 'contact.updated', changed: ['altPhone'] })).toBe('New other phone for a contact');
    expect(summarizeContactChange({ action: 'contact.updated', name: 'Cai Moss', changed: [] })).toBe('Changed Cai Moss');
  });
});
