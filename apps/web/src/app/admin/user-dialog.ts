import { ChangeDetectionStrategy, Component, DestroyRef, inject, signal } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatOption } from '@angular/material/core';
import {
  MAT_DIALOG_DATA,
  MatDialogActions,
  MatDialogClose,
  MatDialogContent,
  MatDialogRef,
  MatDialogTitle,
} from '@angular/material/dialog';
import { MatError, MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSelect } from '@angular/material/select';
import {
  type PlantDto,
  ROLES,
  ROLE_LABELS,
  type Role,
  type UpdateUserRequest,
  type UserDto,
} from '@keelson/contracts';
import type { Observable } from 'rxjs';
import { apiErrorMessage } from '../shared/api-error-message';
import { UsersApi } from './users-api';

/** What the user dialog is opened for: inviting someone new, or changing an existing account. */
export type UserDialogData =
  | { readonly mode: 'invite'; readonly plants: readonly PlantDto[] }
  | { readonly mode: 'edit'; readonly user: UserDto; readonly plants: readonly PlantDto[] };

/** The role that needs plants; every other role has none. */
export const PLANT_SCOPED_ROLE: Role = 'plant_manager';

/**
 * The invite dialog (name, e-mail, role, plants for a plant manager) and the edit dialog (role
 * and plants). It calls the API itself so a refusal (duplicate e-mail, own role) shows inside the
 * dialog, and closes with the saved user.
 */
@Component({
  selector: 'kl-user-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatButton,
    MatDialogActions,
    MatDialogClose,
    MatDialogContent,
    MatDialogTitle,
    MatError,
    MatFormField,
    MatHint,
    MatIcon,
    MatInput,
    MatLabel,
    MatOption,
    MatProgressBar,
    MatSelect,
  ],
  templateUrl: './user-dialog.html',
  styleUrl: './user-dialog.scss',
})
export class UserDialog {
  private readonly usersApi = inject(UsersApi);
  private readonly dialogRef = inject<MatDialogRef<UserDialog, UserDto>>(MatDialogRef);
  private readonly destroyRef = inject(DestroyRef);

  protected readonly data = inject<UserDialogData>(MAT_DIALOG_DATA);
  protected readonly roles = ROLES;
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly isBusy = signal(false);
  protected readonly errorMessage = signal<string | null>(null);
  protected readonly form = inject(NonNullableFormBuilder).group({
    name: ['', [Validators.required, Validators.maxLength(120)]],
    email: ['', [Validators.required, Validators.email, Validators.maxLength(254)]],
    role: ['' as Role | '', [Validators.required]],
    plantCodes: [[] as string[], [Validators.required]],
  });
  protected readonly role = toSignal(this.form.controls.role.valueChanges, {
    initialValue: this.form.controls.role.value,
  });

  constructor() {
    if (this.data.mode === 'edit') {
      const { user } = this.data;
      this.form.setValue({
        name: user.name,
        email: user.email,
        role: user.role,
        plantCodes: [...user.plantCodes],
      });
      // Name and e-mail are not changed here; keep them out of validation and of the request.
      this.form.controls.name.disable();
      this.form.controls.email.disable();
    }
    this.syncPlantsWithRole(this.form.controls.role.value);
    this.form.controls.role.valueChanges
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe((role) => this.syncPlantsWithRole(role));
  }

  protected get title(): string {
    return this.data.mode === 'invite' ? 'Invite a colleague' : `Change ${this.data.user.name}`;
  }

  protected submit(): void {
    if (this.isBusy()) {
      return;
    }
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const value = this.form.getRawValue();
    const role = value.role as Role;
    const plantCodes = role === PLANT_SCOPED_ROLE ? value.plantCodes : [];
    let request: Observable<UserDto>;
    if (this.data.mode === 'invite') {
      request = this.usersApi.invite({
        name: value.name.trim(),
        email: value.email.trim().toLowerCase(),
        role,
        plantCodes,
      });
    } else {
      const change: UpdateUserRequest = { role, plantCodes };
      request = this.usersApi.update(this.data.user.id, change);
    }
    this.isBusy.set(true);
    this.errorMessage.set(null);
    request.pipe(takeUntilDestroyed(this.destroyRef)).subscribe({
      next: (user) => this.dialogRef.close(user),
      error: (error: unknown) => {
        this.isBusy.set(false);
        this.errorMessage.set(apiErrorMessage(error));
      },
    });
  }

  /** Plants are asked for (and required) only while the role is plant manager. */
  private syncPlantsWithRole(role: Role | ''): void {
    const plants = this.form.controls.plantCodes;
    if (role === PLANT_SCOPED_ROLE) {
      plants.enable({ emitEvent: false });
    } else {
      plants.disable({ emitEvent: false });
    }
  }
}
