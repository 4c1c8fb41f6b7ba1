/** The screens the browser tests and the screenshots visit. */

/** Every screen of the demo survey, by a short name. */
export const demoScreens: readonly { name: string; hash: string }[] = [
  { name: 'surveys', hash: '#/' },
  { name: 'survey', hash: '#/s/demo-tallowmere' },
  { name: 'room', hash: '#/s/demo-tallowmere/r/demo-shop' },
  { name: 'entry', hash: '#/s/demo-tallowmere/r/demo-shop/e/demo-shop-troffers' },
  { name: 'catalog', hash: '#/catalog' },
  { name: 'product', hash: '#/catalog/example-a19-basic' },
  { name: 'settings', hash: '#/settings' },
];
