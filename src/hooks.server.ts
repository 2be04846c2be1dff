import { sequence } from '@sveltejs/kit/hooks';
import { handleGuard } from '$lib/server/hooks/guard';
import { handleHeaders } from '$lib/server/hooks/headers';
import { handleOutage, handleServerError } from '$lib/server/hooks/outage';
import { handleSession } from '$lib/server/hooks/session';

export const handle = sequence(handleHeaders, handleOutage, handleSession, handleGuard);
export const handleError = handleServerError;
