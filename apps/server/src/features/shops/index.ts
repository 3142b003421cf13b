// What other features may use of the shop: they import it from here, never from the files inside.
export { toShopCard } from './service';
export { LOGO_BOX, shopLogo } from './logo';
