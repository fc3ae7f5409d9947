/** The app's version (package.json), printed in reports so that a reader knows what made them. */
import { version } from '../../../../package.json';

export const APP_VERSION: string = version;
