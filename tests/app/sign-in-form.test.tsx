import { fireEvent, render, screen, waitFor } from '@testing-library/react-native';

import { SignInForm } from '@/features/auth/sign-in-form';

test('submits the trimmed, lower-cased e-mail and the password', async () => {
  const onSubmit = jest.fn();
  render(<SignInForm onSubmit={onSubmit} />);
  fireEvent.changeText(screen.getByLabelText('E-mail'), '  Inspector@PivotWatch.test ');
  fireEvent.changeText(screen.getByLabelText('Password'), 'pivotwatch-demo');
  fireEvent.press(screen.getByRole('button', { name: 'Sign in' }));
  await waitFor(() => expect(onSubmit).toHaveBeenCalled());
  expect(onSubmit.mock.calls[0][0]).toEqual({
    email: 'inspector@pivotwatch.test',
    password: 'pivotwatch-demo',
  });
});

test('shows field errors and does not submit bad input', async () => {
  const onSubmit = jest.fn();
  render(<SignInForm onSubmit={onSubmit} />);
  fireEvent.changeText(screen.getByLabelText('E-mail'), 'not-an-address');
  fireEvent.press(screen.getByRole('button', { name: 'Sign in' }));
  expect(await screen.findByText('Enter a valid e-mail address')).toBeTruthy();
  expect(await screen.findByText('Enter your password')).toBeTruthy();
  expect(onSubmit).not.toHaveBeenCalled();
});

test('shows the server error it is given', () => {
  render(<SignInForm onSubmit={jest.fn()} error="E-mail or password is wrong." />);
  expect(screen.getByText('E-mail or password is wrong.')).toBeTruthy();
});
