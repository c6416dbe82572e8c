import { useOutletContext } from 'react-router';
import type { MeResponse } from '@shared/api/auth.ts';

/** The signed-in person, as resolved by the app root for every page below it. */
export const useSession = () => useOutletContext<MeResponse>();
