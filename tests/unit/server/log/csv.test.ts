import { describe, expect, it } from 'vitest';
import { exportFileName, LOG_CSV_COLUMNS, safeCell } from '../../../../src/lib/server/services/export';

describe('CSV export helpers', () => {
	it('keeps a spreadsheet from running text cells as formulas', () => {
		expect(safeCell('=HYPERLINK("x")')).toBe(`'=HYPERLINK("x")`);
		expect(safeCell('+ plus green')).toBe("'+ plus green");
		expect(safeCell('@Ada')).toBe("'@Ada");
		expect(safeCell('½ CTO + ¼ plus green')).toBe('½ CTO + ¼ plus green');
		expect(safeCell('')).toBe('');
	});
	it('names the download after the project and the day', () => {
		expect(exportFileName('Night Wash (demo)', 'lighting-log', 'csv', new Date('2026-12-02T03:00:00Z'))).toBe('night-wash-demo-lighting-log-2026-12-02.csv');
		expect(exportFileName('***', 'backup', 'json', new Date('2026-12-02T03:00:00Z'))).toBe('project-backup-2026-12-02.json');
	});
	it('documents every column once', () => {
		const names = LOG_CSV_COLUMNS.map((c) => c.name);
		expect(new Set(names).size).toBe(names.length);
		for (const c of LOG_CSV_COLUMNS) expect(c.description.length).toBeGreaterThan(5);
	});
});
