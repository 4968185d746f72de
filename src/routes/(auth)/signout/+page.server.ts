import { redirect } from '@sveltejs/kit';
import { signOut } from '$lib/server/http/authjs';

export const load = () => redirect(303, '/');

export const actions = { default: signOut };
