import type { BudgetPart, BudgetPartName } from '../../../shared/core/types';

export const BUDGET_PARTS: readonly BudgetPartName[];
export function encodeBudget(parts: readonly BudgetPart[]): string;
export function encodeBudgetSlots(values: ArrayLike<number>, offset: number): string;
export function decodeBudget(stored: unknown): BudgetPart[];
