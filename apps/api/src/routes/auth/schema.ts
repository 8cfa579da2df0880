export {
  AuthSignUpSchema,
  AuthSignInSchema,
  PasswordResetRequestSchema,
  PasswordResetConfirmSchema,
} from '@barmkeep/schemas';
