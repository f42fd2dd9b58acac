import type { TestProject } from 'vitest/node';
import { startTestStack, type TestStack } from '../support/stack';

let stack: TestStack | undefined;

export async function setup(project: TestProject) {
  stack = await startTestStack('api');
  project.provide('testEnv', stack.env);
}

export async function teardown() {
  await stack?.stop();
}
