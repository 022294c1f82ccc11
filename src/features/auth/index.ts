// The signed-out pages, loaded together on first visit to any of them.
export { SignInPage } from './components/sign-in-page.tsx';
export { SignUpPage } from './components/sign-up-page.tsx';
export { VerifyEmailPage } from './components/verify-email-page.tsx';
export { ForgotPasswordPage } from './components/forgot-password-page.tsx';
export { ResetPasswordPage } from './components/reset-password-page.tsx';
