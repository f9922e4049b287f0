import { createMemoryDesignStore } from '../../../api/stores/memory-design-store.js';
import { designStoreContract } from '../../contracts/design-store-contract.js';

designStoreContract('createMemoryDesignStore()', async () => createMemoryDesignStore());
