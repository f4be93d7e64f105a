import { Logger } from '@nestjs/common';
import { NestFactory } from '@nestjs/core';
import {
  minPasswordLength,
  passwordProblemSchema,
  PASSWORD_PROBLEM_MESSAGES,
  usernameSchema,
} from '@stillwell/shared/access';
import { AccessError } from '../common/errors/access-error';
import { validateEnv } from '../config';
import { UsersService } from '../users/users.service';
import { setupEnv, SetupModule } from './setup.module';

/** A broken password rule in the words the console uses too. */
function inWords(problem: string): string {
  const known = passwordProblemSchema.safeParse(problem);
  if (!known.success) return problem;
  return known.data === 'too-short'
    ? `at least ${minPasswordLength(['admin'])} characters`
    : PASSWORD_PROBLEM_MESSAGES[known.data];
}

export interface CreateAdminInput {
  username: string;
  displayName?: string;
  password: string;
}

/**
 * Creates the first administrator in the configured database, refusing when any administrator
 * exists or in demo mode (which seeds its own accounts). Returns a line for the operator to read.
 */
export async function createAdmin(input: CreateAdminInput): Promise<string> {
  if (validateEnv(setupEnv(process.env)).DEMO_MODE) {
    throw new Error('DEMO_MODE is on: demo mode has its own accounts. Run with DEMO_MODE=false.');
  }
  const username = usernameSchema.safeParse(input.username);
  if (!username.success) throw new Error(`--username: ${username.error.issues[0]?.message}`);
  const app = await NestFactory.createApplicationContext(SetupModule.register(), {
    logger: ['error'],
  });
  try {
    const user = await app.get(UsersService).createFirstAdmin({
      username: username.data,
      displayName: input.displayName?.trim() || username.data,
      password: input.password,
    });
    return `Created administrator "${user.username}". Sign in at the console; add a second factor from your profile.`;
  } catch (error) {
    if (error instanceof AccessError) {
      const body = error.getResponse() as { message: string; problems?: string[] };
      throw new Error(
        body.problems ? `${body.message}: ${body.problems.map(inWords).join('; ')}` : body.message,
        { cause: error },
      );
    }
    throw error;
  } finally {
    await app.close();
    Logger.flush();
  }
}
