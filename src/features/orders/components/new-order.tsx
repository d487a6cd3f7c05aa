import { zodResolver } from '@hookform/resolvers/zod';
import { useId, useState } from 'react';
import { useForm } from 'react-hook-form';
import { useNavigate } from 'react-router';
import { useQueryClient } from '@tanstack/react-query';
import { customerInputSchema } from '@shared/schemas/orders';
import type { CustomerInput } from '@shared/schemas/orders';
import type { z } from 'zod';
import { ApiError } from '@/lib/api-client';
import { orderKeys, ordersApi, useCustomers } from '../api/orders';

const input = 'w-full rounded-lg border-2 border-paper-edge bg-white px-3 py-2 font-normal text-ink focus:border-peel focus:outline-none';

/** Starts a quote: an existing buyer or a new one (name and e-mail), and the deposit share asked. */
export function NewOrder({ teamId, onClose }: { teamId: string; onClose: () => void }) {
  const id = useId();
  const navigate = useNavigate();
  const client = useQueryClient();
  const customers = useCustomers(teamId);
  const [customerId, setCustomerId] = useState('new');
  const [deposit, setDeposit] = useState('50');
  const [failure, setFailure] = useState<string | null>(null);
  const form = useForm<z.input<typeof customerInputSchema>, unknown, CustomerInput>({
    resolver: zodResolver(customerInputSchema),
    defaultValues: { name: '', email: '', notes: '' },
  });
  const errors = form.formState.errors;

  const start = async (buyer: CustomerInput | null) => {
    setFailure(null);
    try {
      const chosen = buyer ? (await ordersApi.addCustomer(teamId, buyer)).id : customerId;
      const order = await ordersApi.create(teamId, { customerId: chosen, depositPercent: deposit });
      await client.invalidateQueries({ queryKey: orderKeys.all(teamId) });
      navigate(`/t/${teamId}/orders/${order.id}`);
    } catch (e) {
      if (e instanceof ApiError)
        for (const [field, message] of Object.entries(e.fields)) form.setError(field as keyof CustomerInput, { message });
      setFailure(e instanceof ApiError ? e.message : 'That did not work. Try again.');
    }
  };
  const submit =
    customerId === 'new' ? form.handleSubmit((values) => start(values)) : (e: React.FormEvent) => (e.preventDefault(), void start(null));

  return (
    <form onSubmit={submit} className="mb-6 rounded-sticker border-2 border-ink bg-white p-4" aria-labelledby={`${id}-title`} noValidate>
      <h2 id={`${id}-title`} className="mb-3 text-lg font-extrabold text-ink">
        New quote
      </h2>
      <div className="grid gap-3 md:grid-cols-3">
        <label className="text-sm font-bold text-ink">
          Buyer
          <select className={input} value={customerId} onChange={(e) => setCustomerId(e.target.value)}>
            <option value="new">Someone new…</option>
            {(customers.data ?? []).map((c) => (
              <option key={c.id} value={c.id}>
                {c.name} ({c.email})
              </option>
            ))}
          </select>
        </label>
        {customerId === 'new' && (
          <>
            <label className="text-sm font-bold text-ink">
              Their name
              <input className={input} autoComplete="off" aria-invalid={errors.name ? true : undefined} {...form.register('name')} />
              {errors.name && (
                <span role="alert" className="block text-sm text-alarm">
                  {errors.name.message}
                </span>
              )}
            </label>
            <label className="text-sm font-bold text-ink">
              Their e-mail (proofs go there)
              <input
                className={input}
                type="email"
                autoComplete="off"
                aria-invalid={errors.email ? true : undefined}
                {...form.register('email')}
              />
              {errors.email && (
                <span role="alert" className="block text-sm text-alarm">
                  {errors.email.message}
                </span>
              )}
            </label>
          </>
        )}
        <label className="text-sm font-bold text-ink">
          Deposit asked before printing (%)
          <input className={input} inputMode="numeric" value={deposit} onChange={(e) => setDeposit(e.target.value)} />
          <span className="block text-xs font-normal text-ink-faint">0 asks the whole amount at once.</span>
        </label>
      </div>
      {failure && (
        <p role="alert" className="mt-2 font-bold text-alarm">
          {failure}
        </p>
      )}
      <div className="mt-3 flex gap-2">
        <button type="submit" disabled={form.formState.isSubmitting} className="rounded-full bg-ink px-4 py-2 font-bold text-paper">
          Start the quote
        </button>
        <button type="button" onClick={onClose} className="rounded-full border-2 border-paper-edge px-4 py-2 font-bold text-ink">
          Close
        </button>
      </div>
    </form>
  );
}
