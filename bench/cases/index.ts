/**
 * The registry of benchmark cases, in the order they run.
 */
import type { BenchCase } from '../harness';
import { kambCase } from './kamb';
import { exponentialCase, exponentialCoarseCase } from './exponential';
import { girdleCase } from './girdle';
import { lassoCase, lassoWorstCase } from './lasso';
import { symbolsPanCase, symbolsRenderCase } from './symbols';
import { profileCase } from './profile';
import { localAxisFieldCase } from './localAxisField';

export const benchCases: readonly BenchCase[] = [kambCase, exponentialCoarseCase, exponentialCase, girdleCase, lassoCase, lassoWorstCase, symbolsRenderCase, symbolsPanCase, profileCase, localAxisFieldCase];
