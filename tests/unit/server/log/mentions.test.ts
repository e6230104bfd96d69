import { describe, expect, it } from 'vitest';
import { findMentions } from '../../../../src/lib/server/services/log';

const member = (userId: number, name: string, email = `${name.toLowerCase().replace(/\s+/g, '.')}@example.test`) => ({ userId, name, email });
const crew = [member(1, 'Ada Grade'), member(2, 'Bo Gaffer'), member(3, 'Bo Sparks'), member(4, '', 'nameless@example.test')];
const ids = (body: string) => findMentions(body, crew).map((m) => m.userId);

describe('findMentions', () => {
	it('finds a member by full name, case-insensitive, and by the name without spaces', () => {
		expect(ids('@Ada Grade the key looks green')).toEqual([1]);
		expect(ids('ping @ada grade')).toEqual([1]);
		expect(ids('@AdaGrade?')).toEqual([1]);
	});
	it('takes a first name only when no one else shares it', () => {
		expect(ids('@Ada can you look')).toEqual([1]);
		expect(ids('@Bo can you look')).toEqual([]);
		expect(ids('@Bo Sparks and @Bo Gaffer')).toEqual([2, 3]);
	});
	it('finds a member without a name by the start of their address', () => {
		expect(ids('thanks @nameless')).toEqual([4]);
	});
	it('ignores e-mail addresses, names inside words and text without @', () => {
		expect(ids('mail ada@adagrade.test')).toEqual([]);
		expect(ids('@Adamant')).toEqual([]);
		expect(ids('Ada Grade wrote this')).toEqual([]);
		expect(ids('')).toEqual([]);
	});
	it('lists each member once', () => {
		expect(ids('@Ada Grade @Ada Grade @ada')).toEqual([1]);
	});
});
