import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatSnackBar } from '@angular/material/snack-bar';
import { ApiError } from './api-error';
import { AppErrorHandler } from './app-error-handler';

describe('AppErrorHandler', () => {
  let open: ReturnType<typeof vi.fn>;
  let handler: AppErrorHandler;

  beforeEach(() => {
    open = vi.fn();
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        AppErrorHandler,
        { provide: MatSnackBar, useValue: { open } },
      ],
    });
    handler = TestBed.inject(AppErrorHandler);
    vi.spyOn(console, 'error').mockImplementation(() => undefined);
  });

  it('tells the user one calm sentence for an unexpected error, never its stack', () => {
    const error = new TypeError("Cannot read properties of undefined (reading 'x')");
    handler.handleError(error);
    const [message] = open.mock.calls[0] as [string];
    expect(message).toBe('Something unexpected went wrong. Reload the page if it persists.');
    expect(message).not.toContain('TypeError');
    expect(console.error).toHaveBeenCalledWith(error);
  });

  it("passes an unhandled API error's own sentence on", () => {
    handler.handleError(new ApiError(409, 'already_member', 'This person is already a member.'));
    expect(open.mock.calls[0][0]).toBe('This person is already a member.');
  });
});
