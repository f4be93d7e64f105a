export const usersKeys = {
  all: () => ['users'] as const,
};
