/**
 * The ride and status forms: the API's own zod schemas judge the input (messages from
 * features/registry/schema.ts), values reach the screen in the API's shape, and a refused save puts the
 * server's problems next to the fields they name.
 */
import { fireEvent, render, screen, waitFor } from '@testing-library/react-native';

import { ApiRequestError } from '@/lib/api-errors';
import { RideForm, blankRide } from '@/features/registry/ride-form';
import { StatusForm } from '@/features/registry/status-form';

const operators = [
  { value: 'op-1', label: 'Tamsworth Pier Leisure' },
  { value: 'op-2', label: 'Corvane Travelling Shows' },
];
const sites = [
  { value: 'site-1', label: 'Tamsworth Pier', operatorId: 'op-1' },
  { value: 'site-2', label: 'Lowfield Common fairground', operatorId: 'op-2' },
];

function renderCreate(onSubmit = jest.fn().mockResolvedValue(undefined)) {
  render(
    <RideForm
      mode="create"
      defaultValues={blankRide}
      operators={operators}
      sites={sites}
      onSubmit={onSubmit}
    />,
  );
  return onSubmit;
}

describe('RideForm', () => {
  test('refuses an empty form with the schema’s messages and does not submit', async () => {
    const onSubmit = renderCreate();
    fireEvent.changeText(screen.getByLabelText('Year built'), '1799');
    fireEvent.press(screen.getByRole('button', { name: 'Add ride' }));
    // requiredText() says "Required" for the name and the operator; year() bounds the year.
    expect(await screen.findAllByText('Required')).toHaveLength(2);
    expect(screen.getByText('Must be 1850 or later')).toBeTruthy();
    expect(onSubmit).not.toHaveBeenCalled();
  });

  test('a year that is not a number is refused with the schema’s message', async () => {
    const onSubmit = renderCreate();
    fireEvent.changeText(screen.getByLabelText('Year built'), '20x1');
    fireEvent.press(screen.getByRole('button', { name: 'Add ride' }));
    expect(await screen.findByText('Must be a year')).toBeTruthy();
    expect(onSubmit).not.toHaveBeenCalled();
  });

  test('a restricted ride needs a reason', async () => {
    const onSubmit = renderCreate();
    fireEvent.changeText(screen.getByLabelText('Name'), 'Gull Wing');
    fireEvent.press(screen.getByRole('combobox', { name: /^Operator:/ }));
    fireEvent.press(screen.getByRole('option', { name: 'Tamsworth Pier Leisure' }));
    fireEvent.press(screen.getByRole('radio', { name: 'Restricted' }));
    fireEvent.press(screen.getByRole('button', { name: 'Add ride' }));
    expect(await screen.findByText('Say why the ride is restricted or out of service')).toBeTruthy();
    expect(onSubmit).not.toHaveBeenCalled();
  });

  test('submits the API’s shape: trimmed text, empty text as null, the year as a number', async () => {
    const onSubmit = renderCreate();
    fireEvent.changeText(screen.getByLabelText('Name'), '  Gull Wing ');
    fireEvent.press(screen.getByRole('radio', { name: 'Wheel' }));
    fireEvent.changeText(screen.getByLabelText('Maker'), 'Marrow & Finch Wheelwrights');
    fireEvent.changeText(screen.getByLabelText('Year built'), '2012');
    fireEvent.press(screen.getByRole('combobox', { name: /^Operator:/ }));
    fireEvent.press(screen.getByRole('option', { name: 'Corvane Travelling Shows' }));
    // Only the chosen operator's sites are offered.
    fireEvent.press(screen.getByRole('combobox', { name: /^Site:/ }));
    expect(screen.queryByRole('option', { name: 'Tamsworth Pier' })).toBeNull();
    fireEvent.press(screen.getByRole('option', { name: 'Lowfield Common fairground' }));
    fireEvent.press(screen.getByRole('button', { name: 'Add ride' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalled());
    expect(onSubmit.mock.calls[0][0]).toEqual({
      name: 'Gull Wing',
      rideClass: 'wheel',
      description: null,
      maker: 'Marrow & Finch Wheelwrights',
      model: null,
      serial: null,
      year: 2012,
      siteId: 'site-2',
      operatorCompanyId: 'op-2',
      status: 'in_service',
      statusReason: null,
    });
  });

  test('a refused save shows each server problem beside its field, not as a dump', async () => {
    const onSubmit = jest.fn().mockRejectedValue(
      new ApiRequestError(400, 'validation_failed', 'Some fields are missing or invalid.', [
        { path: 'serial', message: 'Serial ORW-1 is already used by Skylark' },
        { path: 'query.page', message: 'Must be a whole number' },
      ]),
    );
    renderCreate(onSubmit);
    fireEvent.changeText(screen.getByLabelText('Name'), 'Gull Wing');
    fireEvent.changeText(screen.getByLabelText('Serial number'), 'ORW-1');
    fireEvent.press(screen.getByRole('combobox', { name: /^Operator:/ }));
    fireEvent.press(screen.getByRole('option', { name: 'Tamsworth Pier Leisure' }));
    fireEvent.press(screen.getByRole('button', { name: 'Add ride' }));
    expect(await screen.findByText('Serial ORW-1 is already used by Skylark')).toBeTruthy();
    // A problem with no field of its own is listed in words above the button.
    expect(screen.getByText('Nothing was saved.')).toBeTruthy();
    expect(screen.getByText('• query › page: Must be a whole number')).toBeTruthy();
    expect(screen.queryByText(/validation_failed/)).toBeNull();
  });
});

describe('StatusForm', () => {
  test('out of service without a reason is refused', async () => {
    const onSubmit = jest.fn();
    render(
      <StatusForm
        defaultValues={{ status: 'in_service', statusReason: '', statusSince: '' }}
        onSubmit={onSubmit}
      />,
    );
    fireEvent.press(screen.getByRole('radio', { name: 'Out of service' }));
    fireEvent.press(screen.getByRole('button', { name: 'Save status' }));
    expect(await screen.findByText('Say why the ride is restricted or out of service')).toBeTruthy();
    expect(onSubmit).not.toHaveBeenCalled();
  });

  test('submits status and reason; an empty "since" is left to the server', async () => {
    const onSubmit = jest.fn().mockResolvedValue(undefined);
    render(
      <StatusForm
        defaultValues={{ status: 'in_service', statusReason: '', statusSince: '' }}
        onSubmit={onSubmit}
      />,
    );
    fireEvent.press(screen.getByRole('radio', { name: 'Restricted' }));
    fireEvent.changeText(screen.getByLabelText('Reason'), ' Main pin at its wear limit ');
    fireEvent.press(screen.getByRole('button', { name: 'Save status' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalled());
    expect(onSubmit.mock.calls[0][0]).toEqual({
      status: 'restricted',
      statusReason: 'Main pin at its wear limit',
      statusSince: undefined,
    });
  });

  test('a date for "since" becomes the API’s ISO instant; a bad one is refused', async () => {
    const onSubmit = jest.fn().mockResolvedValue(undefined);
    render(
      <StatusForm
        defaultValues={{ status: 'restricted', statusReason: 'Bushing worn', statusSince: '' }}
        onSubmit={onSubmit}
      />,
    );
    fireEvent.changeText(screen.getByLabelText('Since'), 'yesterday');
    fireEvent.press(screen.getByRole('button', { name: 'Save status' }));
    expect(
      await screen.findByText('Must be a date or date-time, e.g. 2025-05-01 or 2025-05-01T08:30:00Z'),
    ).toBeTruthy();
    fireEvent.changeText(screen.getByLabelText('Since'), '2026-11-30');
    fireEvent.press(screen.getByRole('button', { name: 'Save status' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalled());
    expect(onSubmit.mock.calls[0][0].statusSince).toBe('2026-11-30T00:00:00.000Z');
  });

  test('a restricted ride is not offered "In service": the status rules say how it returns', async () => {
    const onSubmit = jest.fn().mockResolvedValue(undefined);
    render(
      <StatusForm
        defaultValues={{ status: 'restricted', statusReason: 'Bushing worn', statusSince: '' }}
        onSubmit={onSubmit}
      />,
    );
    expect(screen.queryByRole('radio', { name: 'In service' })).toBeNull();
    expect(screen.getByRole('radio', { name: 'Out of service' })).toBeTruthy();
    expect(screen.getByText(/approved follow-up inspection/)).toBeTruthy();
  });

  test('keeping a ride in service sends no reason', async () => {
    const onSubmit = jest.fn().mockResolvedValue(undefined);
    render(
      <StatusForm
        defaultValues={{ status: 'in_service', statusReason: 'left over', statusSince: '' }}
        onSubmit={onSubmit}
      />,
    );
    expect(screen.queryByText(/approved follow-up inspection/)).toBeNull();
    fireEvent.press(screen.getByRole('button', { name: 'Save status' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalled());
    expect(onSubmit.mock.calls[0][0]).toMatchObject({ status: 'in_service', statusReason: null });
  });
});
