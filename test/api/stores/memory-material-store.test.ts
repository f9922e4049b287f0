import { createMemoryMaterialStore } from '../../../api/stores/memory-material-store.js';
import { materialStoreContract } from '../../contracts/material-store-contract.js';

materialStoreContract('createMemoryMaterialStore()', async () => createMemoryMaterialStore());
